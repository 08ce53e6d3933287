import { describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { findBiomassComposition, resolveElementStatements } from '$chemistry';
import { db } from '$lib/server/db';
import { organismProfile, study } from '$lib/server/db/schema';
import { evaluateStudy } from '$lib/server/studies/evaluate';
import { checkProfileFormula, describeProfileElements } from '$lib/server/studies/profile-elements';
import { profileFormValues } from '$lib/server/studies/profile-store';
import { loadStudyInputs } from '$lib/server/studies/queries';
import { createProfileForm } from './profile-form';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

const NEIDHARDT = findBiomassComposition('bacterium-neidhardt-1990')!;

const { saved, failure } = createProfileForm('Elements', {
	group: 'bacterium',
	kind: 'elementalFractions',
	carbonSourceId: 'd-glucose',
	yieldXSGPerG: '0.5',
	muMaxPerH: '0.5',
	ksGPerL: '0.05'
});

describe('each element of a profile: its role and how sure its value is', () => {
	it('takes each value of a published table with the grade the table gives it (chemistry/data/biomass.ts)', () => {
		const row = saved({ presetId: 'bacterium-neidhardt-1990' });
		// Neidhardt, Ingraham & Schaechter (1990): N, P confirmed; Fe from memory.
		expect(row.elementStatements?.N).toEqual({ confidence: 'confirmed', source: NEIDHARDT.source });
		expect(row.elementStatements?.Fe).toEqual({
			confidence: 'from memory',
			source: NEIDHARDT.source
		});
		const elements = describeProfileElements(row);
		expect(elements.find((e) => e.symbol === 'Fe')).toEqual({
			symbol: 'Fe',
			fraction: 0.002,
			role: 'trace',
			roleFrom: 'default',
			confidence: 'from memory',
			source: NEIDHARDT.source
		});
		expect(elements.find((e) => e.symbol === 'K')).toMatchObject({
			role: 'required',
			roleFrom: 'default'
		});
		// H and O are taken from water and O2: listed, not assessed.
		expect(elements.find((e) => e.symbol === 'H')).toMatchObject({
			role: null,
			confidence: 'confirmed'
		});
		// The edit form starts from them.
		const values = profileFormValues(row);
		expect(values['element.Fe.confidence']).toBe('from memory');
		expect(values['element.Fe.role']).toBe('');
		expect(values['element.N.source']).toBe(NEIDHARDT.source);
	});

	it('stores a role and a confidence the user sets, and a study then takes Fe as a requirement', async () => {
		const row = saved({
			elementalFractions: 'C 0.5\nN 0.14\nP 0.03\nFe 0.002',
			'element.Fe.role': 'required',
			'element.Fe.confidence': 'measured',
			'element.Fe.source': 'ICP-OES of our strain, 2025',
			'element.N.confidence': 'measured',
			// A row the form still held for an element taken out of the fractions is not kept.
			'element.Zn.role': 'trace'
		});
		expect(row.elementStatements).toEqual({
			C: {},
			N: { confidence: 'measured' },
			P: {},
			Fe: { role: 'required', confidence: 'measured', source: 'ICP-OES of our strain, 2025' }
		});
		expect(describeProfileElements(row).find((e) => e.symbol === 'Fe')).toMatchObject({
			role: 'required',
			roleFrom: 'profile',
			confidence: 'measured'
		});
		expect(describeProfileElements(row).find((e) => e.symbol === 'C')).toMatchObject({
			role: 'required',
			confidence: 'unstated',
			source: null
		});

		// The demo bacterium study with this profile: its basal and feed carry little Fe, and Fe is now required.
		const pilot = db
			.select()
			.from(study)
			.where(eq(study.name, 'Bacterium glucose fed-batch, pilot (demo)'))
			.get()!;
		const inputs = structuredClone(loadStudyInputs(pilot.id).inputs);
		inputs.profile = row;
		const report = await evaluateStudy(inputs);
		const fe = report.nutrients.lines.find((l) => l.key === 'Fe')!;
		expect(fe).toMatchObject({
			role: 'required',
			roleFrom: 'profile',
			confidence: 'measured',
			source: 'ICP-OES of our strain, 2025'
		});
		expect(fe.ratio).toBeLessThan(report.nutrients.lines.find((l) => l.key === 'N')!.ratio);
		expect(report.limit.key).toBe('Fe');
		expect(report.reasons[0]).toMatch(/Fe limits first/);
		expect(
			report.defaults.find((d) => d.what === 'Roles of the elements (required or trace)')!.value
		).toBe("default, except Fe required (the profile's)");
	});

	it('names the field by its label and keeps everything typed when a statement cannot be stored', () => {
		const typed = {
			elementalFractions: 'C 0.5\nN 0.14\nFe 0.002',
			'element.Fe.confidence': 'confirmed',
			'element.Fe.source': '',
			'element.N.role': 'trace',
			notes: 'kept'
		};
		const noSource = failure(typed);
		expect(noSource.fieldErrors['element.Fe.source']).toEqual([
			'Source of Fe: a published or derived value needs its source (the table or paper it comes from).'
		]);
		expect(noSource.values).toMatchObject({
			elementalFractions: 'C 0.5\nN 0.14\nFe 0.002',
			'element.Fe.confidence': 'confirmed',
			'element.N.role': 'trace',
			notes: 'kept'
		});
		expect(
			failure({ ...typed, 'element.Fe.source': 'x'.repeat(401) }).fieldErrors[
				'element.Fe.source'
			][0]
		).toMatch(/^Source of Fe: at most 400 characters \(now 401\)/);
		expect(
			failure({ ...typed, 'element.Fe.source': 'a table', 'element.N.role': 'essential' })
				.fieldErrors['element.N.role'][0]
		).toMatch(/^Role of N:/);
		expect(
			failure({ ...typed, 'element.Fe.source': 'a table', 'element.Fe.confidence': 'sure' })
				.fieldErrors['element.Fe.confidence'][0]
		).toMatch(/of Fe/);
	});

	it('reads a profile saved before statements were kept: the table grade where its value is still the table’s', () => {
		const row = saved({ presetId: 'bacterium-neidhardt-1990' });
		const legacy = {
			...row,
			elementStatements: null,
			elementalFractions: { ...row.elementalFractions!, Fe: 0.003 }
		};
		const statements = resolveElementStatements(legacy);
		expect(statements.N).toEqual({ confidence: 'confirmed', source: NEIDHARDT.source });
		// Fe changed from the table's 0.002: no longer the table's value, so no grade is claimed for it.
		expect(statements.Fe).toEqual({ source: NEIDHARDT.source });
	});
});

describe('the profile page checks the fractions against the formula', () => {
	it('warns with both values when they disagree, and not when they agree', () => {
		// Neidhardt et al. (1990) N 14 % against CH1.8O0.5N0.2 with 8 % ash: 0.2 × 14.007 / 24.626 × 0.92 = 10.47 %
		// (24.626 g/C-mol, chemistry/REFERENCES.md, derived).
		const contradicting = saved({
			elementalFractions: 'C 0.5\nH 0.08\nO 0.2\nN 0.14',
			biomassFormula: 'CH1.8O0.5N0.2',
			ashFraction: '0.08'
		});
		const warnings = checkProfileFormula(contradicting);
		expect(warnings.find((w) => w.startsWith('N '))).toMatch(
			/^N is 14 % in the fractions but 10\.5 % by the formula CH1\.8O0\.5N0\.2 with 8 % ash/
		);
		expect(warnings).toHaveLength(4);
		const demo = db
			.select()
			.from(organismProfile)
			.where(eq(organismProfile.name, 'Demo bacterium PPN-B1'))
			.get()!;
		expect(checkProfileFormula(demo)).toEqual([]);
		// The demo's C, H, O, N are those of CH1.8O0.5N0.2 with 8 % ash: N 0.2 × 14.007 / 24.626 × 0.92.
		expect(demo.elementalFractions!.N).toBeCloseTo((0.2 * 14.007 * 0.92) / 24.626, 4);
		expect(demo.elementStatements!.N.confidence).toBe('derived');
		expect(demo.elementStatements!.Fe.confidence).toBe('from memory');
		expect(checkProfileFormula({ ...contradicting, biomassFormula: 'CH1.8Q' })[0]).toMatch(
			/^The fractions cannot be checked against the formula/
		);
	});
});
