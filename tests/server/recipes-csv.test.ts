import Papa from 'papaparse';
import { count } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { component } from '$lib/server/db/schema';
import {
	exportComponentsCsv,
	importComponentCsv,
	previewComponentCsv
} from '$lib/server/components/csv';
import { findComponentByIdOrName } from '$lib/server/components/library';
import { exportVersionCsv, importLineCsv, previewLineCsv } from '$lib/server/recipes/csv';
import { findRecipe, findVersionById, linesOf } from '$lib/server/recipes/queries';
import { RuleError } from '$lib/server/rule-error';
import { makeUser } from './helpers';
import { draftRecipe, line, loadLibrary } from './recipes-fixtures';

const componentCount = () => db.select({ n: count() }).from(component).get()!.n;

function ruleMessage(run: () => unknown): string {
	try {
		run();
	} catch (error) {
		if (error instanceof RuleError) return error.message;
		throw error;
	}
	return 'no error';
}

let actor: { id: string; email: string };
beforeAll(async () => {
	loadLibrary();
	const person = await makeUser(['media_scientist']);
	actor = { id: person.id, email: person.email };
});

describe('component CSV import', () => {
	it('a file with one bad row writes nothing and names each bad row and why', () => {
		const before = componentCount();
		const csv = [
			'name,category,formula,cas_number,ghs_hazards',
			'Invented salt A,salt,KNaSO4,,',
			'Invented salt B,salt,Xq2O,,',
			'Sodium chloride,salt,NaCl,,',
			'Invented salt C,salt,KCl,7447-40-8,H302',
			'Invented salt A,salt,KCl,,'
		].join('\n');
		const preview = previewComponentCsv(csv);
		expect(preview.errorCount).toBe(4);
		expect(preview.rows.map((r) => [r.rowNumber, r.errors.length > 0])).toEqual([
			[2, false],
			[3, true],
			[4, true],
			[5, true],
			[6, true]
		]);
		expect(preview.rows[1].errors.join(' ')).toMatch(/^formula: .*Xq/);
		expect(preview.rows[2].errors).toEqual([
			'name: A component named “Sodium chloride” already exists.'
		]);
		expect(preview.rows[3].errors).toEqual([
			'cas_number: The check digit of 7447-40-8 is wrong; look at the number again.'
		]);
		expect(preview.rows[4].errors).toEqual(['name: “Invented salt A” is also on row 2.']);
		expect(ruleMessage(() => importComponentCsv(actor, csv))).toMatch(
			/4 rows have problems; nothing was imported/
		);
		expect(componentCount()).toBe(before);
		expect(findComponentByIdOrName('Invented salt A')).toBeUndefined();
	});

	it('wrong columns refuse the whole file with the expected columns listed', () => {
		const message = ruleMessage(() => previewComponentCsv('title,formula\nSomething,NaCl'));
		expect(message).toMatch(/unknown column “title”; missing name, category/);
		expect(message).toMatch(
			/Expected columns: name, category \(required\), and optionally id, formula,/
		);
	});

	it('a clean file goes in whole, with complex materials and hazards', () => {
		const before = componentCount();
		const added = importComponentCsv(
			actor,
			'name,category,formula,elemental_mass_fractions,ghs_hazards,solubility_g_per_l\nInvented peptone P1,complex,,C=0.42; N=0.12; P=0.01,,\nInvented chelate Q,other,C10H14N2Na2O8·2H2O,,H332; H373,25:100'
		);
		expect(added).toBe(2);
		expect(componentCount()).toBe(before + 2);
		const peptone = findComponentByIdOrName('invented peptone p1')!;
		expect(peptone.elementalMassFractions).toEqual({ C: 0.42, N: 0.12, P: 0.01 });
		expect(peptone.fractionsNote).toMatch(/certificate/);
		expect(findComponentByIdOrName('Invented chelate Q')?.ghsHazards.map((h) => h.code)).toEqual([
			'H332',
			'H373'
		]);
	});

	it('exports the library with the import columns', () => {
		const parsed = Papa.parse<Record<string, string>>(exportComponentsCsv(), {
			header: true,
			comments: '#',
			skipEmptyLines: true
		});
		expect(parsed.meta.fields?.slice(0, 4)).toEqual(['id', 'name', 'category', 'formula']);
		expect(parsed.data.find((r) => r.id === 'magnesium-sulfate-heptahydrate')).toMatchObject({
			formula: 'MgSO4·7H2O',
			basis_component: 'magnesium-sulfate'
		});
		// N 14.007 + 4 × H 1.008 + Cl 35.45 = 53.489 g/mol (IUPAC 2021 abridged standard atomic
		// weights); the sum in binary floating point is 53.489000000000004, which no file should show.
		const ammoniumChloride = parsed.data.find((r) => r.formula === 'NH4Cl');
		expect(ammoniumChloride?.molar_mass_g_per_mol).toBe('53.489');
		const longest = Math.max(
			...parsed.data.flatMap((r) =>
				[r.molar_mass_g_per_mol, r.osmotic_coefficient]
					.filter(Boolean)
					.map((v) => v.replace(/^-|\.|e.*$/g, '').replace(/^0+/, '').length)
			)
		);
		expect(longest).toBeLessThanOrEqual(12);
	});
});

describe('recipe line CSV import', () => {
	it('a bad row writes nothing; the preview gives row numbers and reasons', () => {
		const draft = draftRecipe(actor, [line('sodium-chloride', 5)]);
		const csv =
			'component,amount,unit,note\nD-Glucose anhydrous,20,mM,\nPotassium chloride,0,g/L,\nGlycine,1,ppm,\nSodium chloride,1,g/L,\nNo such thing,1,g/L,';
		const preview = previewLineCsv(findVersionById(draft.versionId)!, csv, 'append');
		expect(preview.rows.map((r) => [r.rowNumber, r.errors])).toEqual([
			[2, []],
			[3, ['amount: the amount must be greater than zero, not 0.']],
			[4, [expect.stringMatching(/^unit: Unknown concentration unit 'ppm'/)]],
			[5, ['component: Sodium chloride is already on line 1; combine the two lines.']],
			[6, ['component: no component “No such thing” in the library.']]
		]);
		const before = findVersionById(draft.versionId)!.revision;
		expect(
			ruleMessage(() => importLineCsv(actor, findVersionById(draft.versionId)!, csv, 'append'))
		).toMatch(/4 rows have problems; nothing was imported/);
		expect(linesOf(draft.versionId)).toHaveLength(1);
		expect(findVersionById(draft.versionId)!.revision).toBe(before);
	});

	it('a clean file is appended in order, and the version exports back to the same lines', () => {
		const draft = draftRecipe(actor, [line('sodium-chloride', 5)]);
		const added = importLineCsv(
			actor,
			findVersionById(draft.versionId)!,
			'component,amount,unit,shelf_form,note\nMagnesium sulfate,2,mM,Magnesium sulfate heptahydrate,add last\nd-glucose,4.5,g/L,,',
			'append'
		);
		expect(added).toBe(2);
		expect(
			linesOf(draft.versionId).map((l) => [
				l.position,
				l.componentId,
				l.shelfFormId,
				l.amount,
				l.unit
			])
		).toEqual([
			[1, 'sodium-chloride', null, 5, 'g/L'],
			[2, 'magnesium-sulfate', 'magnesium-sulfate-heptahydrate', 2, 'mM'],
			[3, 'd-glucose', null, 4.5, 'g/L']
		]);
		const csv = exportVersionCsv(findRecipe(draft.recipeId)!, findVersionById(draft.versionId)!);
		const rows = Papa.parse<Record<string, string>>(csv, {
			header: true,
			comments: '#',
			skipEmptyLines: true
		}).data;
		expect(rows.map((r) => [r.component, r.amount, r.unit])).toEqual([
			['Sodium chloride', '5', 'g/L'],
			['Magnesium sulfate, anhydrous', '2', 'mM'],
			['D-Glucose, anhydrous', '4.5', 'g/L']
		]);
	});

	it('re-importing a version’s own export with Replace gives the same lines and fields', () => {
		const instructions =
			'Dissolve in 800 mL water.\nAdjust to "pH 7.2" with 1 M NaOH; make up to 1 L.';
		const draft = draftRecipe(
			actor,
			[line('sodium-chloride', 5), line('d-glucose', 4.5), line('potassium-chloride', 0.4)],
			'basal',
			{
				targetPh: '7.2',
				osmolalityMinMOsmPerKg: '280',
				osmolalityMaxMOsmPerKg: '330',
				preparationTemperatureC: '30',
				shelfLifeDays: '28',
				storage: '2–8 °C, dark',
				instructions
			}
		);
		const version = () => findVersionById(draft.versionId)!;
		const csv = exportVersionCsv(findRecipe(draft.recipeId)!, version());
		expect(csv).toContain('# target_ph: 7.2');
		expect(csv).toContain(`# instructions: ${JSON.stringify(instructions)}`);

		const appended = previewLineCsv(version(), csv, 'append');
		expect(appended.errorCount).toBe(3);
		expect(appended.fieldsLeftAlone).toContain('Target pH');

		const replaced = previewLineCsv(version(), csv, 'replace');
		expect(replaced.rows.flatMap((r) => r.errors)).toEqual([]);
		expect(replaced.errorCount).toBe(0);
		expect(replaced.draftLineCount).toBe(3);
		expect(replaced.fieldChanges).toEqual([]);
		const linesBefore = linesOf(draft.versionId).map(({ id: _id, ...l }) => l);
		expect(importLineCsv(actor, version(), csv, 'replace')).toBe(3);
		expect(linesOf(draft.versionId).map(({ id: _id, ...l }) => l)).toEqual(linesBefore);
		expect(version()).toMatchObject({
			targetPh: 7.2,
			osmolalityMinMOsmPerKg: 280,
			osmolalityMaxMOsmPerKg: 330,
			preparationTemperatureC: 30,
			shelfLifeDays: 28,
			storage: '2–8 °C, dark',
			instructions
		});
	});

	it('Replace takes the file’s fields, refuses a bad one by its label, and Append leaves them', () => {
		const draft = draftRecipe(actor, [line('sodium-chloride', 5)], 'basal', { targetPh: '7.0' });
		const version = () => findVersionById(draft.versionId)!;
		const file = (ph: string) =>
			`# a note that is not a field\n# target_ph: ${ph}\n# storage: "Room temperature"\ncomponent,amount,unit\nPotassium chloride,0.4,g/L`;
		const refused = previewLineCsv(version(), file('15'), 'replace');
		expect(refused.errorCount).toBe(1);
		expect(refused.fieldProblems).toEqual([
			'Version fields: Target pH is between 0 and 14, not 15.'
		]);
		expect(ruleMessage(() => importLineCsv(actor, version(), file('15'), 'replace'))).toMatch(
			/nothing was imported/
		);
		expect(version().targetPh).toBe(7);

		const preview = previewLineCsv(version(), file('7.4'), 'replace');
		expect(preview.fieldChanges).toEqual([
			{ label: 'Target pH', from: '7', to: '7.4' },
			{ label: 'Storage', from: '(empty)', to: 'Room temperature' }
		]);
		importLineCsv(actor, version(), file('7.4'), 'replace');
		expect(linesOf(draft.versionId).map((l) => l.componentId)).toEqual(['potassium-chloride']);
		expect(version()).toMatchObject({ targetPh: 7.4, storage: 'Room temperature' });

		importLineCsv(actor, version(), file('6.8').replace('Potassium chloride', 'Glycine'), 'append');
		expect(linesOf(draft.versionId).map((l) => l.componentId)).toEqual([
			'potassium-chloride',
			'glycine'
		]);
		expect(version().targetPh).toBe(7.4);
	});

	it('an unclosed text field is refused with how to write it', () => {
		const draft = draftRecipe(actor, [line('sodium-chloride', 5)]);
		const preview = previewLineCsv(
			findVersionById(draft.versionId)!,
			'# instructions: "Dissolve\ncomponent,amount,unit\nGlycine,1,g/L',
			'replace'
		);
		expect(preview.fieldProblems).toEqual([
			expect.stringMatching(/^Instructions \(instructions\): the text is not closed properly/)
		]);
	});

	it('wrong columns are one clear message', () => {
		const draft = draftRecipe(actor, [line('sodium-chloride', 5)]);
		expect(
			ruleMessage(() =>
				previewLineCsv(findVersionById(draft.versionId)!, 'ingredient;qty\nx;1', 'append')
			)
		).toMatch(
			/The columns are not right: unknown columns “ingredient”, “qty”; missing component, amount, unit\. Expected columns: component, amount, unit \(required\)/
		);
	});
});
