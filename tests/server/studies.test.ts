import { describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { AIR_O2_MOLE_FRACTION, ATOMIC_WEIGHTS, formulaMolarMass } from '$chemistry';
import { db } from '$lib/server/db';
import { recipe, recipeVersion, study } from '$lib/server/db/schema';
import { RuleError } from '$lib/server/rule-error';
import { listComponents } from '$lib/server/components/library';
import { evaluateStudy } from '$lib/server/studies/evaluate';
import {
	designFeed,
	listSubstanceChoices,
	oneFormPerSubstance,
	substanceIdOf,
	type FeedDesign
} from '$lib/server/studies/feed-designer';
import { previewDraft } from '$lib/server/recipes/preview';
import { describeVersions, listProfiles, loadStudyInputs } from '$lib/server/studies/queries';
import { listStudiesPage } from '$lib/server/studies/study-list';
import type { StudyForm } from '$lib/server/studies/study-form';
import { createStudy } from '$lib/server/studies/study-store';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

const YEAST_STUDY = 'Yeast glycerol fed-batch, bench (demo)';
const BACTERIUM_STUDY = 'Bacterium glucose fed-batch, pilot (demo)';

function studyId(name: string): string {
	return db.select().from(study).where(eq(study.name, name)).get()!.id;
}
const components = () => new Map(listComponents().map((c) => [c.id, c]));

function ruleErrorOf(run: () => unknown): RuleError {
	try {
		run();
	} catch (cause) {
		if (cause instanceof RuleError) return cause;
		throw cause;
	}
	throw new Error('expected a RuleError');
}

describe('a study on the demo data, checked by hand', () => {
	it('finds nitrogen limiting the yeast fed-batch, at the density worked out here', async () => {
		const report = await evaluateStudy(loadStudyInputs(studyId(YEAST_STUDY)).inputs);
		// Supply of N, per litre of the final 8 L (6 L basal + 2 L feed):
		//   (NH4)2SO4 is 2 N per formula unit: 2 × 14.007 / 132.134 g N per g (IUPAC 2021 weights, D in our references)
		const nPerSulfate = (2 * ATOMIC_WEIGHTS.N) / formulaMolarMass('(NH4)2SO4');
		//   basal 5 g/L × 6 L + feed 70 g/L × 2 L = 30 + 140 = 170 g (NH4)2SO4 → × 0.2120 = 36.04 g N → / 8 L = 4.505 g/L
		const supplyN = ((5 * 6 + 70 * 2) * nPerSulfate) / 8;
		// Demand of N: the yeast formula CH1.61O0.56N0.16 (BioNumbers BNID 101801) with 6 % ash (from memory):
		//   f_N = 0.16 × 14.007 / (12.011 + 1.61 × 1.008 + 0.56 × 15.999 + 0.16 × 14.007) × 0.94 = 0.08482 g/g
		const formulaMass =
			ATOMIC_WEIGHTS.C +
			1.61 * ATOMIC_WEIGHTS.H +
			0.56 * ATOMIC_WEIGHTS.O +
			0.16 * ATOMIC_WEIGHTS.N;
		const fN = ((0.16 * ATOMIC_WEIGHTS.N) / formulaMass) * 0.94;
		//   at the target 40 g/L: 3.393 g/L; ratio 4.505 / 3.393 = 1.328 ≥ 1.2 (safety factor, common practice): sufficient
		const ratio = supplyN / (fN * 40);
		//   maximum supportable = 40 × 1.328 / 1.2 = 44.3 g/L
		const maxX = (40 * ratio) / 1.2;
		// Glycerol (carbon, Yx/s 0.5 demo value): (40 × 6 + 500 × 2) / 8 = 155 g/L against 40 / 0.5 = 80 g/L → 1.94, not limiting.
		expect(report.limit.key).toBe('N');
		const n = report.nutrients.lines.find((l) => l.key === 'N')!;
		expect(n.supplyGPerL).toBeCloseTo(supplyN, 3);
		expect(n.ratio).toBeCloseTo(ratio, 2);
		expect(report.limit.maxBiomassGPerL).toBeCloseTo(maxX, 1);
		expect(maxX).toBeCloseTo(44.3, 1);
		expect(report.nutrients.lines.find((l) => l.key === 'glycerol')!.ratio).toBeCloseTo(
			155 / 80,
			3
		);
		expect(report.verdict).toBe('supported');
	});

	it('lists every default it used, with its source', async () => {
		const report = await evaluateStudy(loadStudyInputs(studyId(BACTERIUM_STUDY)).inputs);
		const what = report.defaults.map((d) => d.what);
		expect(what).toEqual(
			expect.arrayContaining([
				'Safety factor',
				'Heat per mol O2 consumed',
				'Yx/O2',
				'Elemental mass fractions',
				'Oxygen solubility'
			])
		);
		expect(report.defaults.find((d) => d.what === 'Heat per mol O2 consumed')!.source).toMatch(
			/Birou/
		);
		expect(report.defaults.find((d) => d.what === 'Elemental mass fractions')!.source).toMatch(
			/Neidhardt/
		);
		// The bacterial study sparges air: no fire caution for enriched gas.
		expect(report.cautions.join(' ')).not.toMatch(/fire/);
		expect(report.cautions.join(' ')).toMatch(/pressure rating/);
	});

	it('carries the enriched-gas caution when the plan or the what-if sparges more O2 than air', async () => {
		const yeast = await evaluateStudy(loadStudyInputs(studyId(YEAST_STUDY)).inputs);
		expect(yeast.inputs.o2MoleFraction).toBe(0.5);
		expect(yeast.cautions.join(' ')).toMatch(/Oxygen-enriched gas raises the risk of fire/);
		const bacterium = loadStudyInputs(studyId(BACTERIUM_STUDY)).inputs;
		const enriched = await evaluateStudy(bacterium, { o2MoleFraction: 0.3 });
		expect(enriched.cautions.join(' ')).toMatch(/Oxygen-enriched gas raises the risk of fire/);
		const yeastOnAir = await evaluateStudy(loadStudyInputs(studyId(YEAST_STUDY)).inputs, {
			o2MoleFraction: AIR_O2_MOLE_FRACTION
		});
		expect(yeastOnAir.cautions.join(' ')).not.toMatch(/fire/);
	});

	it('says what limits the bacterial run: nutrients and oxygen; short trace elements are warnings', async () => {
		const report = await evaluateStudy(loadStudyInputs(studyId(BACTERIUM_STUDY)).inputs);
		expect(report.verdict).toBe('not supported');
		const short = report.nutrients.lines.filter((l) => !l.sufficient);
		expect(short.map((l) => l.key)).toEqual(expect.arrayContaining(['N', 'Ca', 'Fe']));
		// N is required: a reason, and the limit. Ca (no source) and Fe are trace elements by default
		// (common practice): warnings naming them, never the limit and never a reason.
		expect(report.limit.key).toBe('N');
		expect(short.filter((l) => l.role === 'required').map((l) => l.key)).toEqual(['N']);
		expect(report.reasons.filter((r) => /short of/.test(r))).toEqual([
			expect.stringMatching(/^N runs short of 1\.2 × demand; N limits first/)
		]);
		expect(report.reasons.join(' ')).not.toMatch(/\b(Ca|Fe)\b/);
		expect(report.warnings).toEqual(
			expect.arrayContaining([
				expect.stringMatching(/^Ca is in no source/),
				expect.stringMatching(/^Fe covers [\d.]+ × its demand/)
			])
		);
		expect(
			report.defaults.find((d) => d.what === 'Roles of the elements (required or trace)')!.source
		).toMatch(/Common practice/);
		expect(report.oxygen.check).toBe('short');
		expect(report.reasons.some((r) => r.includes('does not allow O2 enrichment'))).toBe(true);
	});

	it('marks each nutrient line with its role, how sure its value is and its source', async () => {
		const report = await evaluateStudy(loadStudyInputs(studyId(BACTERIUM_STUDY)).inputs);
		const line = (key: string) => report.nutrients.lines.find((l) => l.key === key)!;
		// The demo bacterium: C, H, O, N derived from CH1.8O0.5N0.2 with 8 % ash; P and S confirmed in Neidhardt et al.
		// (1990); Fe from memory (chemistry/data/biomass.ts); Yx/s from its RQ by element balance.
		expect(line('N')).toMatchObject({
			role: 'required',
			roleFrom: 'default',
			confidence: 'derived',
			source: expect.stringMatching(/CH1\.8O0\.5N0\.2.*8 % ash/)
		});
		expect(line('P')).toMatchObject({
			role: 'required',
			confidence: 'confirmed',
			source: expect.stringMatching(/Neidhardt/)
		});
		expect(line('Fe')).toMatchObject({
			role: 'trace',
			confidence: 'from memory',
			source: expect.stringMatching(/Neidhardt/)
		});
		expect(line('d-glucose')).toMatchObject({
			role: 'required',
			confidence: 'derived',
			source: expect.stringMatching(/RQ/)
		});
	});

	it('warns when the fractions of the profile contradict its formula, naming both values', async () => {
		// The demo bacterium as it stood before: Neidhardt et al. (1990) fractions (N 14 %) with CH1.8O0.5N0.2 and 8 % ash,
		// whose N is 0.2 × 14.007 / 24.626 × 0.92 = 10.47 % (24.626 g/C-mol, chemistry/REFERENCES.md, derived).
		const inputs = structuredClone(loadStudyInputs(studyId(BACTERIUM_STUDY)).inputs);
		inputs.profile.elementalFractions = {
			...inputs.profile.elementalFractions!,
			C: 0.5,
			O: 0.2,
			N: 0.14,
			H: 0.08
		};
		const report = await evaluateStudy(inputs);
		expect(report.warnings).toEqual(
			expect.arrayContaining([
				expect.stringMatching(
					/^N is 14 % in the fractions but 10\.5 % by the formula CH1\.8O0\.5N0\.2 with 8 % ash/
				)
			])
		);
		// The saved demo profile agrees with its formula: no such warning.
		expect(
			(await evaluateStudy(loadStudyInputs(studyId(BACTERIUM_STUDY)).inputs)).warnings.join(' ')
		).not.toMatch(/by the formula/);
	});
});

describe('the what-if', () => {
	it('turns the verdict when kLa is lowered, and back with enough O2', async () => {
		const inputs = loadStudyInputs(studyId(YEAST_STUDY)).inputs;
		const low = await evaluateStudy(inputs, { kLaPerH: 60 });
		expect(low.verdict).toBe('not supported');
		expect(low.oxygen.check).toBe('short');
		// max OTR = kLa (C* − C_set) is linear in kLa at a fixed gas
		const saved = await evaluateStudy(inputs);
		expect(low.oxygen.maxOtrMmolPerLH / saved.oxygen.maxOtrMmolPerLH).toBeCloseTo(60 / 400, 6);
	});

	it('refuses a target of zero or beyond physical sense with a clear message', async () => {
		const inputs = loadStudyInputs(studyId(YEAST_STUDY)).inputs;
		await expect(evaluateStudy(inputs, { targetValue: 0 })).rejects.toThrow(/greater than 0/);
		await expect(evaluateStudy(inputs, { targetValue: 500 })).rejects.toThrow(
			/beyond physical sense/
		);
		try {
			await evaluateStudy(inputs, { targetValue: 500 });
		} catch (cause) {
			expect((cause as RuleError).field).toBe('targetValue');
		}
	});

	it('flags a vessel that does not allow enrichment', async () => {
		const report = await evaluateStudy(loadStudyInputs(studyId(BACTERIUM_STUDY)).inputs, {
			o2MoleFraction: 0.4
		});
		expect(report.reasons.join(' ')).toMatch(/does not allow O2 enrichment/);
	});
});

/** A proposed feed as the recipe editor would send it, through the recipe preview (what the editor shows). */
function previewFeed(feed: FeedDesign['feeds'][number], design: FeedDesign) {
	return previewDraft({
		lines: feed.lines.map((l) => ({
			kind: 'component',
			componentId: l.componentId,
			amount: l.gPerL,
			unit: 'g/L'
		})),
		preparationTemperatureC: design.temperatureC,
		osmolalityMaxMOsmPerKg: design.osmolalityMaxMOsmPerKg
	});
}

// The feed an engineer first tried for the bacterial study: glucose, ammonium, calcium, iron, phosphate and magnesium salts.
const BACTERIUM_FEED = [
	'd-glucose',
	'ammonium-sulfate',
	'calcium-chloride',
	'iron-ii-sulfate',
	'sodium-dihydrogen-phosphate',
	'magnesium-sulfate'
];

describe('the feed designer', () => {
	it('splits the bacterial feed in two that the recipe preview passes, within the limits and the vessel', () => {
		const { inputs } = loadStudyInputs(studyId(BACTERIUM_STUDY));
		const design = designFeed(inputs, components(), {
			componentIds: BACTERIUM_FEED,
			feedVolumeL: 30,
			temperatureC: 25
		});
		expect(design.problems).toEqual([]);
		expect(design.feasible).toBe(true);
		// In one feed the recipe analysis flags all three phosphates: Ca and Fe from 1 and 0.01 mM with 1 mM phosphate, Mg from 1 mM with 10 mM.
		expect(design.split?.precipitates).toEqual([
			'calcium phosphate',
			'magnesium phosphate',
			'iron phosphate'
		]);
		expect(design.feeds.map((f) => f.label)).toEqual(['Feed A', 'Feed B']);
		expect(design.feeds[0].lines.map((l) => l.componentId).sort()).toEqual([
			'calcium-chloride',
			'iron-ii-sulfate',
			'magnesium-sulfate'
		]);
		expect(design.feeds[1].lines.map((l) => l.componentId)).toContain(
			'sodium-dihydrogen-phosphate'
		);
		// Pilot vessel 200 L with 120 L of culture: 80 L of room.
		expect(design.feeds.reduce((s, f) => s + f.volumeL, 0)).toBeCloseTo(30, 9);
		// Microbial defaults, common practice: 4000 mOsm/kg and 700 g/L per feed.
		expect(design.osmolalityMaxMOsmPerKg).toBe(4000);
		expect(design.limitsSource).toMatch(/common practice/i);
		for (const feed of design.feeds) {
			const preview = previewFeed(feed, design);
			expect(preview.warnings.filter((w) => w.kind === 'precipitation')).toEqual([]);
			expect(preview.warnings.filter((w) => w.kind === 'solubility')).toEqual([]);
			expect(preview.osmolality.verdict).toBe('within');
			expect(preview.osmolality.estimateMOsmPerKg).toBeLessThanOrEqual(4000);
			expect(preview.dissolvedSolidsGPerL).toBeLessThanOrEqual(700);
			// The designer shows the preview's own numbers for the feed.
			expect(feed.osmolalityMOsmPerKg).toBeCloseTo(preview.osmolality.estimateMOsmPerKg, 9);
			expect(feed.dissolvedSolidsGPerL).toBeCloseTo(preview.dissolvedSolidsGPerL, 9);
		}
		for (const c of design.coverage) expect(c.providedG).toBeGreaterThanOrEqual(c.neededG);
	});

	it('says why 15 L will not do and how much would', () => {
		// This was 20 L while the demo bacterium counted N at 14 % of dry mass. Its C, H, O, N now come from its
		// formula CH1.8O0.5N0.2 with 8 % ash (N 10.5 %), so the feed carries less ammonium and about 19.8 L fit
		// within 4000 mOsm/kg; 15 L still do not.
		const { inputs } = loadStudyInputs(studyId(BACTERIUM_STUDY));
		const design = designFeed(inputs, components(), {
			componentIds: BACTERIUM_FEED,
			feedVolumeL: 15,
			temperatureC: 25
		});
		expect(design.feasible).toBe(false);
		expect(design.problems[0]).toMatch(/osmolality limit of 4000 mOsm\/kg/);
		expect(design.problems.at(-1)).toMatch(
			/split in two\. With these components and limits, two feeds of at least [\d.]+ L in all would work/
		);
		expect(design.minimumFeedVolumeL).toBeGreaterThan(15);
		const atLeast = designFeed(inputs, components(), {
			componentIds: BACTERIUM_FEED,
			feedVolumeL: Math.ceil(design.minimumFeedVolumeL! * 10) / 10,
			temperatureC: 25
		});
		expect(atLeast.feasible).toBe(true);
	});

	it('meets every demand of the yeast study with its feed components, apart from calcium and phosphate', () => {
		const { inputs } = loadStudyInputs(studyId(YEAST_STUDY));
		const ids = [
			'glycerol',
			'ammonium-sulfate',
			'potassium-dihydrogen-phosphate',
			'magnesium-sulfate-heptahydrate',
			'calcium-chloride-dihydrate',
			'zinc-sulfate-heptahydrate',
			'iron-ii-sulfate-heptahydrate'
		];
		const design = designFeed(inputs, components(), {
			componentIds: ids,
			feedVolumeL: 2,
			temperatureC: 25
		});
		expect(design.problems).toEqual([]);
		expect(design.split?.precipitates).toContain('calcium phosphate');
		for (const c of design.coverage) expect(c.providedG).toBeGreaterThanOrEqual(c.neededG);
		for (const feed of design.feeds) {
			for (const l of feed.lines)
				if (l.solubilityGPerL !== null) expect(l.gPerL).toBeLessThanOrEqual(l.solubilityGPerL);
			expect(previewFeed(feed, design).warnings).toEqual([]);
		}
	});

	it('takes the limits the user sets', () => {
		const { inputs } = loadStudyInputs(studyId(BACTERIUM_STUDY));
		const design = designFeed(inputs, components(), {
			componentIds: BACTERIUM_FEED,
			feedVolumeL: 40,
			temperatureC: 25,
			osmolalityMaxMOsmPerKg: 3000,
			dissolvedSolidsMaxGPerL: 500
		});
		expect(design.feasible).toBe(true);
		expect(design.limitsSource).toBeNull();
		for (const feed of design.feeds) {
			expect(feed.osmolalityMOsmPerKg).toBeLessThanOrEqual(3000);
			expect(feed.dissolvedSolidsGPerL).toBeLessThanOrEqual(500);
		}
	});

	it('explains why tyrosine cannot go in a neutral concentrate', async () => {
		const engineer = db.select().from(study).get()!.createdById;
		const basal = db
			.select({ id: recipeVersion.id })
			.from(recipeVersion)
			.innerJoin(recipe, eq(recipe.id, recipeVersion.recipeId))
			.where(eq(recipe.name, 'PPN CD Basal M1'))
			.get()!.id;
		const feed = db
			.select({ id: recipeVersion.id })
			.from(recipeVersion)
			.innerJoin(recipe, eq(recipe.id, recipeVersion.recipeId))
			.where(eq(recipe.name, 'PPN Feed GA-12'))
			.get()!.id;
		const inputs = loadStudyInputs(studyId(YEAST_STUDY)).inputs;
		const id = await createStudy({ id: engineer, email: 'engineer@demo.test' }, {
			name: 'Mammalian fed-batch for the designer test',
			basalVersionId: basal,
			profileId: listProfiles().find((p) => p.name === 'Demo mammalian line PPN-M3')!.id,
			vesselId: inputs.vessel.id,
			targetBasis: 'cellsPerMl',
			targetValue: 2e7,
			initialVolumeL: 6,
			inoculumDensity: 3e5,
			durationH: 336,
			temperatureC: 37,
			pressureKPa: 101.325,
			o2MoleFraction: AIR_O2_MOLE_FRACTION,
			doSetpointPercent: 40,
			safetyFactor: 1.2,
			heatPerMolO2KJ: null,
			plannedAgitationRpm: null,
			plannedGasFlowLPerMin: null,
			notes: '',
			feed1VersionId: feed,
			feed1VolumeL: 1,
			feed1Strategy: 'constant',
			feed1StartH: 72,
			feed2VersionId: null,
			feed2VolumeL: null,
			feed3VersionId: null,
			feed3VolumeL: null
		} as StudyForm);
		const design = designFeed(loadStudyInputs(id).inputs, components(), {
			componentIds: [
				'd-glucose',
				'l-glutamine',
				'l-leucine',
				'l-lysine-hydrochloride',
				'l-tyrosine'
			],
			feedVolumeL: 0.5,
			temperatureC: 25
		});
		expect(design.feasible).toBe(false);
		// Cell-culture defaults, common practice: 1500 mOsm/kg.
		expect(design.osmolalityMaxMOsmPerKg).toBe(1500);
		// Tyrosine 0.453 g/L at 25 °C (CRC Handbook, as stored in the component library)
		expect(design.problems.join(' ')).toMatch(
			/L-Tyrosine would need [\d.]+ g\/L, above its solubility of 0.453 g\/L at 25 °C; use a soluble salt form or a separate alkaline feed/
		);
	});

	it('refuses a feed that would overfill the vessel, naming the field', () => {
		const { inputs } = loadStudyInputs(studyId(YEAST_STUDY));
		const refused = ruleErrorOf(() =>
			designFeed(inputs, components(), {
				componentIds: ['glycerol'],
				feedVolumeL: 5,
				temperatureC: 25
			})
		);
		expect(refused.message).toMatch(/maximum working volume of 10 L; at most 4 L fits/);
		expect(refused.field).toBe('feedVolumeL');
	});

	it('takes one form of each substance, and says so of a second', () => {
		const { inputs } = loadStudyInputs(studyId(BACTERIUM_STUDY));
		const twoForms = ruleErrorOf(() =>
			designFeed(inputs, components(), {
				componentIds: ['d-glucose', 'magnesium-sulfate', 'magnesium-sulfate-heptahydrate'],
				feedVolumeL: 30,
				temperatureC: 25
			})
		);
		expect(twoForms.field).toBe('componentIds.2');
		expect(twoForms.message).toBe(
			'Magnesium sulfate heptahydrate and Magnesium sulfate, anhydrous are two forms of one substance; a feed takes one form of each. Keep one of them.'
		);
		expect(
			ruleErrorOf(() =>
				designFeed(inputs, components(), {
					componentIds: ['d-glucose', 'd-glucose'],
					feedVolumeL: 30,
					temperatureC: 25
				})
			).field
		).toBe('componentIds.1');
		const unknown = ruleErrorOf(() =>
			designFeed(inputs, components(), {
				componentIds: ['unobtainium'],
				feedVolumeL: 30,
				temperatureC: 25
			})
		);
		expect(unknown.field).toBe('componentIds.0');
		expect(unknown.message).toBe('No component “unobtainium” in the library.');
	});

	it("offers each substance once, in the form the study's feeds weigh, else its basis form", () => {
		const library = listComponents();
		const byId = new Map(library.map((c) => [c.id, c]));
		const loaded = loadStudyInputs(studyId(BACTERIUM_STUDY)).inputs;
		// The glucose feed's composition lists MgSO4·7H2O and its MgSO4 equivalent; the feed weighs the first.
		const feedIds = loaded.feeds.flatMap((f) => Object.keys(f.composition.componentsGPerL));
		expect(feedIds).toEqual(
			expect.arrayContaining(['magnesium-sulfate', 'magnesium-sulfate-heptahydrate'])
		);
		const preselected = oneFormPerSubstance(feedIds, byId);
		expect(preselected).toEqual(['d-glucose', 'magnesium-sulfate-heptahydrate']);
		const choices = listSubstanceChoices(library, preselected);
		const substances = choices.map((c) => c.substanceId);
		expect(new Set(substances).size).toBe(substances.length);
		expect(choices.flatMap((c) => c.forms.map((f) => f.id)).sort()).toEqual(
			library.map((c) => c.id).sort()
		);
		expect(choices.find((c) => c.substanceId === 'magnesium-sulfate')!.offeredId).toBe(
			'magnesium-sulfate-heptahydrate'
		);
		expect(choices.find((c) => c.substanceId === 'l-lysine')).toMatchObject({
			offeredId: 'l-lysine'
		});
		expect(choices.find((c) => c.substanceId === 'l-lysine')!.forms.map((f) => f.id)).toEqual(
			expect.arrayContaining(['l-lysine', 'l-lysine-hydrochloride'])
		);
		for (const c of choices) expect(substanceIdOf(c.offeredId, byId)).toBe(c.substanceId);
	});
});

describe('saved studies and recipe versions', () => {
	it('links each study to its versions and says when one is superseded', () => {
		const { rows, total } = listStudiesPage(undefined, {
			page: 1,
			limit: 50,
			sort: 'updatedAt',
			dir: 'desc'
		});
		expect(total).toBe(rows.length);
		const searched = listStudiesPage('yeast', { page: 1, limit: 50, sort: 'name', dir: 'asc' });
		expect(searched.rows.map((r) => r.name)).toContain(YEAST_STUDY);
		expect(searched.rows.map((r) => r.name)).not.toContain(BACTERIUM_STUDY);
		expect(rows.map((r) => r.name)).toEqual(expect.arrayContaining([YEAST_STUDY, BACTERIUM_STUDY]));
		const yeast = rows.find((r) => r.name === YEAST_STUDY)!;
		expect(yeast.basal.recipeName).toBe('PPN Yeast-Glycerol A');
		expect(yeast.feeds[0].recipeName).toBe('PPN Glycerol Feed Y2');
		expect(yeast.basal.superseded).toBe(false);
		// A later approved version supersedes the one a study used.
		const v = db.select().from(recipeVersion).where(eq(recipeVersion.id, yeast.feeds[0].id)).get()!;
		const newer = crypto.randomUUID();
		db.insert(recipeVersion)
			.values({
				id: newer,
				recipeId: v.recipeId,
				n: v.n + 1,
				status: 'draft',
				authorId: v.authorId
			})
			.run();
		db.update(recipeVersion)
			.set({ status: 'approved', approvedAt: new Date() })
			.where(eq(recipeVersion.id, newer))
			.run();
		const ref = describeVersions([v.id]).get(v.id)!;
		expect(ref.superseded).toBe(true);
		expect(ref.supersededBy).toBe(v.n + 1);
	});
});
