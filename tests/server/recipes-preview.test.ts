import { beforeAll, describe, expect, it } from 'vitest';
import { computeComposition, findReferenceComponent } from '$chemistry';
import { DraftProblems, previewDraft } from '$lib/server/recipes/preview';
import { signVersion, submitForReview } from '$lib/server/recipes/workflow';
import { makeUser } from './helpers';
import { draftRecipe, line, loadLibrary } from './recipes-fixtures';

type Body = Parameters<typeof previewDraft>[0];

/** The problems named: refused outright, or the lines the analysis left out. */
function problemsOf(body: Body): Record<string, string[]> {
	try {
		const { leftOut } = previewDraft(body);
		if (!leftOut.length) throw new Error('expected problems');
		const out: Record<string, string[]> = {};
		for (const { path, message } of leftOut) (out[path] ??= []).push(message);
		return out;
	} catch (error) {
		if (error instanceof DraftProblems) return error.fieldErrors;
		throw error;
	}
}

const reference = (id: string) => findReferenceComponent(id)!;
const lineBody = (
	componentId: string,
	amount: number | string,
	unit: string,
	extra: Partial<Body['lines'][number]> = {}
) => ({
	kind: 'component' as const,
	componentId,
	amount,
	unit,
	...extra
});

beforeAll(() => loadLibrary());

describe('the preview computes what the chemistry library computes', () => {
	it('matches computeComposition on the reference components, element by element', () => {
		const result = previewDraft({
			preparationTemperatureC: 25,
			osmolalityMinMOsmPerKg: 250,
			osmolalityMaxMOsmPerKg: 350,
			lines: [
				lineBody('sodium-chloride', 6, 'g/L'),
				lineBody('d-glucose', 20, 'mM'),
				lineBody('potassium-dihydrogen-phosphate', 1, 'mM')
			]
		});
		const expected = computeComposition({
			lines: [
				{ component: reference('sodium-chloride'), amount: 6, unit: 'g/L' },
				{ component: reference('d-glucose'), amount: 20, unit: 'mM' },
				{ component: reference('potassium-dihydrogen-phosphate'), amount: 1, unit: 'mM' }
			],
			temperatureC: 25
		});
		for (const element of expected.elements) {
			expect(result.elements.find((e) => e.symbol === element.symbol)?.gPerL).toBeCloseTo(
				element.gPerL,
				10
			);
		}
		expect(result.totalCarbonGPerL).toBeCloseTo(expected.totalCarbonGPerL, 10);
		expect(result.totalNitrogenGPerL).toBe(0);
		expect(result.osmolality.estimateMOsmPerKg).toBeCloseTo(
			expected.osmolality.estimateMOsmPerKg,
			8
		);
		// 6 g/L NaCl: 102.7 mM × 2 × 0.93; glucose 20 × 1.01; KH2PO4 1 × 2 × 0.87 ≈ 213 mOsm/kg, below 250.
		expect(result.osmolality.estimateMOsmPerKg).toBeCloseTo(213.0, 0);
		expect(result.osmolality.verdict).toBe('below');
	});

	it('counts a line weighed as a hydrate as the same moles of the hydrate', () => {
		const result = previewDraft({
			lines: [
				lineBody('magnesium-sulfate', 2, 'mM', { shelfFormId: 'magnesium-sulfate-heptahydrate' })
			]
		});
		expect(result.components[0].name).toBe(reference('magnesium-sulfate-heptahydrate').name);
		expect(result.components[0].mM).toBeCloseTo(2, 10);
		expect(result.components[0].gPerL).toBeCloseTo(
			0.002 * reference('magnesium-sulfate-heptahydrate').molarMassGPerMol!,
			10
		);
		expect(result.elements.find((e) => e.symbol === 'Mg')?.mmolPerL).toBeCloseTo(2, 10);
	});

	it('expands a stock line by dose/1000 and merges it with the same component given directly', async () => {
		const scientist = await makeUser(['media_scientist']);
		const engineer = await makeUser(['engineer']);
		const stock = draftRecipe(
			scientist,
			[line('sodium-chloride', 100), line('zinc-sulfate-heptahydrate', 2)],
			'stock_solution'
		);
		const draftOnly = previewDraft({
			lines: [
				lineBody('sodium-chloride', 2, 'g/L'),
				{ kind: 'stock', stockRecipeId: stock.recipeId, amount: 10, unit: 'mL/L' }
			]
		});
		expect(draftOnly.notes.join(' ')).toMatch(/has no approved version yet/);
		submitForReview(scientist, stock.versionId, stock.revision);
		await signVersion({ ...engineer }, stock.versionId, {
			password: engineer.password,
			meaning: 'approved',
			comment: ''
		});
		const result = previewDraft({
			lines: [
				lineBody('sodium-chloride', 2, 'g/L'),
				{ kind: 'stock', stockRecipeId: stock.recipeId, amount: 10, unit: 'mL/L' }
			]
		});
		const sodiumChloride = result.components.find((c) => c.id === 'sodium-chloride')!;
		expect(sodiumChloride.gPerL).toBeCloseTo(3, 10);
		expect(sodiumChloride.lines).toEqual([0, 1]);
		expect(result.components.find((c) => c.id === 'zinc-sulfate-heptahydrate')?.gPerL).toBeCloseTo(
			0.02,
			10
		);
		expect(result.notes.join(' ')).toMatch(/version 1 \(approved\)/);
	});

	it('warns when tyrosine is above its solubility at the preparation temperature', () => {
		const result = previewDraft({
			preparationTemperatureC: 25,
			lines: [lineBody('d-glucose', 250, 'g/L'), lineBody('l-tyrosine', 3, 'g/L')]
		});
		const warning = result.warnings.find((w) => w.kind === 'solubility');
		expect(warning?.message).toMatch(
			/L-Tyrosine at 3 g\/L exceeds its solubility of about 0.453 g\/L at 25 °C/
		);
		expect(warning?.lines).toEqual([1]);
		expect(previewDraft({ lines: [lineBody('l-tyrosine', 0.3, 'g/L')] }).warnings).toEqual([]);
	});

	it('flags the calcium phosphate pair, marked common practice', () => {
		const result = previewDraft({
			lines: [
				lineBody('calcium-chloride-dihydrate', 2, 'mM'),
				lineBody('potassium-dihydrogen-phosphate', 5, 'mM')
			]
		});
		expect(result.warnings).toEqual([
			expect.objectContaining({ kind: 'precipitation', basis: 'common practice', lines: [0, 1] })
		]);
	});
});

describe('the valid lines are analysed while others are wrong', () => {
	it('analyses the good line and names the bad one as left out, in the indexes sent', () => {
		const preview = previewDraft({
			preparationTemperatureC: 25,
			lines: [lineBody('unobtainium', 1, 'g/L'), lineBody('sodium-chloride', 5, 'g/L')]
		} as Body);
		expect(preview.leftOut).toEqual([
			{ path: 'lines.0.componentId', message: 'Line 1: no component “unobtainium” in the library.' }
		]);
		expect(preview.components.map((c) => [c.id, c.gPerL, c.lines])).toEqual([
			['sodium-chloride', 5, [1]]
		]);
	});

	it('refuses when no line is left to analyse', () => {
		expect(() => previewDraft({ lines: [lineBody('unobtainium', 1, 'g/L')] } as Body)).toThrow(
			DraftProblems
		);
	});
});

describe('bad lines are refused beside the line they are on', () => {
	it('names each problem by its line and field, all at once', () => {
		const problems = problemsOf({
			lines: [
				lineBody('sodium-chloride', 5, 'g/L'),
				lineBody('sodium-chloride', 1, 'g/L'),
				lineBody('potassium-chloride', 0, 'g/L'),
				lineBody('d-glucose', -2, 'g/L'),
				lineBody('glycine', 1, 'ppm'),
				lineBody('unobtainium', 1, 'g/L'),
				lineBody('', 1, 'g/L'),
				lineBody('yeast-extract', 1, 'mM')
			]
		});
		expect(problems['lines.1.componentId']).toEqual([
			'Line 2: Sodium chloride is already on line 1; combine the two lines.'
		]);
		expect(problems['lines.2.amount']).toEqual([
			'Line 3: the amount must be greater than zero, not 0.'
		]);
		expect(problems['lines.3.amount']).toEqual([
			'Line 4: the amount must be greater than zero, not -2.'
		]);
		expect(problems['lines.4.unit']?.[0]).toMatch(
			/Unknown concentration unit 'ppm'; use one of g\/L, mg\/L/
		);
		expect(problems['lines.5.componentId']).toEqual([
			'Line 6: no component “unobtainium” in the library.'
		]);
		expect(problems['lines.6.componentId']).toEqual(['Line 7: choose a component.']);
		expect(problems['lines.7.unit']?.[0]).toMatch(/no formula or molar mass/);
		expect(problems['lines.0.componentId']).toBeUndefined();
	});

	it('refuses a stock dosed in a concentration unit, and an osmolality range upside down', () => {
		const problems = problemsOf({
			osmolalityMinMOsmPerKg: 400,
			osmolalityMaxMOsmPerKg: 300,
			lines: [{ kind: 'stock', stockRecipeId: 'no-such-stock', amount: 1, unit: 'g/L' }]
		});
		expect(problems['lines.0.stockRecipeId']).toEqual([
			'Line 1: no recipe with id “no-such-stock”.'
		]);
		expect(problems['lines.0.unit']?.[0]).toMatch(/dosed in mL\/L/);
		expect(problems.osmolalityMaxMOsmPerKg?.[0]).toMatch(/low to high/);
	});
});
