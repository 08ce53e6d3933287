import { beforeAll, describe, expect, it } from 'vitest';
import { analyseLines, type AnalysisLine } from '$lib/server/recipes/analysis';
import {
	compareCompositions,
	compareVersions,
	type ComparableLine
} from '$lib/server/recipes/compare';
import type { CheckedFields } from '$lib/server/recipes/draft';
import { loadLibrary } from './recipes-fixtures';

beforeAll(() => loadLibrary());

const FIELDS: CheckedFields = {
	targetPh: 7,
	osmolalityMinMOsmPerKg: null,
	osmolalityMaxMOsmPerKg: null,
	preparationTemperatureC: 25,
	shelfLifeDays: null,
	storage: '',
	instructions: '',
	changeNote: ''
};

function comparable(position: number, componentId: string, amount: number): ComparableLine {
	return {
		position,
		kind: 'component',
		componentId,
		componentName: componentId,
		shelfFormId: null,
		shelfFormName: null,
		stockRecipeId: null,
		stockRecipeName: null,
		amount,
		unit: 'g/L',
		tolerancePercent: 2,
		note: ''
	};
}

const analysed = (lines: [string, number][]) =>
	analyseLines(
		lines.map(([componentId, amount]): AnalysisLine => ({
			kind: 'component',
			componentId,
			shelfFormId: null,
			stockRecipeId: null,
			amount,
			unit: 'g/L'
		})),
		{ temperatureC: 25, osmolalityMinMOsmPerKg: null, osmolalityMaxMOsmPerKg: null }
	);

describe('comparing two versions', () => {
	const v1 = [
		comparable(1, 'sodium-chloride', 6),
		comparable(2, 'potassium-chloride', 0.4),
		comparable(3, 'd-glucose', 4.5),
		comparable(4, 'glycine', 0.03)
	];

	it('a removed line leaves the lines after it the same: they keep their order among themselves', () => {
		const v2 = [
			comparable(1, 'sodium-chloride', 6),
			comparable(2, 'd-glucose', 4.5),
			comparable(3, 'glycine', 0.03)
		];
		const result = compareVersions({ fields: FIELDS, lines: v1 }, { fields: FIELDS, lines: v2 });
		expect(result.lines.map((l) => [l.key, l.status])).toEqual([
			['component:sodium-chloride', 'same'],
			['component:d-glucose', 'same'],
			['component:glycine', 'same'],
			['component:potassium-chloride', 'removed']
		]);
	});

	it('a real reorder is a change of the lines that moved', () => {
		const v2 = [
			comparable(1, 'sodium-chloride', 6),
			comparable(2, 'd-glucose', 4.5),
			comparable(3, 'potassium-chloride', 0.4),
			comparable(4, 'glycine', 0.03)
		];
		const result = compareVersions({ fields: FIELDS, lines: v1 }, { fields: FIELDS, lines: v2 });
		const changed = result.lines.filter((l) => l.status === 'changed');
		expect(changed.map((l) => [l.key, l.changes])).toEqual([
			['component:d-glucose', ['order of addition 3 → 2']],
			['component:potassium-chloride', ['order of addition 2 → 3']]
		]);
	});

	it('shows what removing 6 g/L NaCl does to the medium: Na and Cl fall by their share of it', () => {
		const before = analysed([
			['sodium-chloride', 6],
			['d-glucose', 4.5]
		]);
		const after = analysed([['d-glucose', 4.5]]);
		const rows = compareCompositions(before, after);
		// 6 g/L × 22.990 / 58.44 g/mol = 2.3603 g/L Na; 6 × 35.45 / 58.44 = 3.6397 g/L Cl
		// (IUPAC 2021 abridged standard atomic weights, Na 22.990, Cl 35.45; NaCl 58.44 g/mol).
		const na = rows.find((r) => r.label === 'Na')!;
		expect(na.before).toBeCloseTo((6 * 22.99) / (22.99 + 35.45), 3);
		expect(na.after).toBe(0);
		expect(rows.find((r) => r.label === 'Cl')!.before).toBeCloseTo((6 * 35.45) / 58.44, 3);
		expect(rows.map((r) => r.label)).toContain('Osmolality, estimated');
		expect(rows.map((r) => r.label)).not.toContain('C');
		expect(compareCompositions(before, before)).toEqual([]);
	});
});
