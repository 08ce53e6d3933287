import { describe, expect, it } from 'vitest';
import {
	WATER_CONVENTION,
	computeMassToWeigh,
	computeStockVolume,
	hydrateFactor,
	type MassToWeighInput
} from '../../chemistry/weighing';
import { errorOf } from './input-error';

// Molar masses from IUPAC 2021 standard atomic weights (Prohaska et al., Pure Appl. Chem. 94:573, 2022):
// MgSO4·7H2O 246.466 and CaCl2·2H2O 147.008 as derived in chemistry/REFERENCES.md; the anhydrous salts by hand:
// MgSO4 = 24.305 + 32.06 + 4 × 15.999 = 120.361; CaCl2 = 40.078 + 2 × 35.45 = 110.978.
const M_MGSO4_7H2O = 246.466;
const M_MGSO4 = 120.361;
const M_CACL2_2H2O = 147.008;
const M_CACL2 = 110.978;

describe('hydrateFactor', () => {
	it('is the molar-mass ratio of shelf to basis form, per basis unit', () => {
		// By hand from the IUPAC molar masses above: 246.466 / 120.361 = 2.04772; 476.536 / (2 × 219.237) = 1.08681.
		expect(hydrateFactor(M_MGSO4_7H2O, M_MGSO4)).toBeCloseTo(2.04772, 5);
		expect(hydrateFactor(476.536, 219.237, 2)).toBeCloseTo(1.08681, 5);
	});
});

describe('computeMassToWeigh', () => {
	const mgso4 = { targetGPerL: 0.5, volumeL: 1, basis: { formula: 'MgSO4' } };

	it('converts an anhydrous basis to the heptahydrate on the shelf', () => {
		const result = computeMassToWeigh({ ...mgso4, shelfForm: { formula: 'MgSO4·7H2O' } });
		expect(result.factors.hydrate).toBeCloseTo(M_MGSO4_7H2O / M_MGSO4, 5);
		expect(result.massG).toBeCloseTo((0.5 * M_MGSO4_7H2O) / M_MGSO4, 5); // 1.02386 g
		expect(result.basisMassG).toBe(0.5);
	});

	it('corrects for a 98 % assay and 2 % extra water', () => {
		const result = computeMassToWeigh({
			...mgso4,
			shelfForm: { formula: 'MgSO4·7H2O', assayPercent: 98, waterContentPercent: 2 }
		});
		expect(result.factors.assay).toBeCloseTo(100 / 98, 12);
		expect(result.factors.water).toBeCloseTo(100 / 98, 12);
		const byHand = ((0.5 * M_MGSO4_7H2O) / M_MGSO4) * (100 / 98) * (100 / 98); // 1.06608 g
		expect(result.massG).toBeCloseTo(byHand, 5);
		expect(result.factors.total).toBeCloseTo(byHand / 0.5, 5);
		expect(result.steps.join('\n')).toMatch(/assay factor 100 \/ 98/);
		expect(result.steps.join('\n')).toMatch(/water factor 100 \/ \(100 − 2\)/);
	});

	it('scales with volume and accepts a molar mass instead of a formula', () => {
		const result = computeMassToWeigh({
			targetGPerL: 1,
			volumeL: 20,
			basis: { molarMassGPerMol: M_CACL2 },
			shelfForm: { formula: 'CaCl2·2H2O' }
		});
		expect(result.massG).toBeCloseTo((20 * M_CACL2_2H2O) / M_CACL2, 3);
	});

	it('takes a molar target, where the hydrate factor cancels', () => {
		// 2 mM in 1 L is 2 mmol of CaCl2·2H2O whatever the basis: 2e-3 × 147.008 g.
		const result = computeMassToWeigh({
			target: { amount: 2, unit: 'mM' },
			volumeL: 1,
			basis: { formula: 'CaCl2' },
			shelfForm: { formula: 'CaCl2·2H2O' }
		});
		expect(result.massG).toBeCloseTo(2e-3 * M_CACL2_2H2O, 5);
	});

	it('handles several basis units per shelf unit (pantothenate from calcium pantothenate)', () => {
		// Ca(C9H16NO5)2 = 476.536 and C9H17NO5 = 219.237 g/mol by hand from IUPAC 2021 weights.
		const result = computeMassToWeigh({
			targetGPerL: 0.004,
			volumeL: 1,
			basis: { formula: 'C9H17NO5' },
			shelfForm: { formula: 'Ca(C9H16NO5)2' },
			basisUnitsPerShelfUnit: 2
		});
		expect(result.factors.hydrate).toBeCloseTo(476.536 / (2 * 219.237), 4);
	});

	it('treats the target as the shelf form when no basis is given', () => {
		const result = computeMassToWeigh({
			targetGPerL: 10,
			volumeL: 0.5,
			shelfForm: { assayPercent: 99.5 }
		});
		expect(result.factors.hydrate).toBe(1);
		expect(result.massG).toBeCloseTo((10 * 0.5 * 100) / 99.5, 12);
	});

	it('accepts a documented assay above 100 % and explains its water convention', () => {
		const result = computeMassToWeigh({
			targetGPerL: 1,
			volumeL: 1,
			shelfForm: { assayPercent: 101 }
		});
		expect(result.massG).toBeCloseTo(100 / 101, 12);
		expect(result.convention).toBe(WATER_CONVENTION);
		expect(WATER_CONVENTION).toMatch(/non-stoichiometric/);
	});

	const base: MassToWeighInput = {
		targetGPerL: 1,
		volumeL: 1,
		basis: { formula: 'MgSO4' },
		shelfForm: { formula: 'MgSO4·7H2O' }
	};
	it.each<[string, Partial<MassToWeighInput>, string]>([
		[
			'a zero assay',
			{ shelfForm: { formula: 'MgSO4·7H2O', assayPercent: 0 } },
			'shelfForm.assayPercent'
		],
		[
			'a negative assay',
			{ shelfForm: { formula: 'MgSO4·7H2O', assayPercent: -5 } },
			'shelfForm.assayPercent'
		],
		[
			'an assay above 102 %',
			{ shelfForm: { formula: 'MgSO4·7H2O', assayPercent: 103 } },
			'shelfForm.assayPercent'
		],
		[
			'a NaN assay',
			{ shelfForm: { formula: 'MgSO4·7H2O', assayPercent: Number.NaN } },
			'shelfForm.assayPercent'
		],
		[
			'100 % water',
			{ shelfForm: { formula: 'MgSO4·7H2O', waterContentPercent: 100 } },
			'shelfForm.waterContentPercent'
		],
		[
			'negative water',
			{ shelfForm: { formula: 'MgSO4·7H2O', waterContentPercent: -1 } },
			'shelfForm.waterContentPercent'
		],
		['a zero volume', { volumeL: 0 }, 'volumeL'],
		['a negative target', { targetGPerL: -1 }, 'targetGPerL'],
		[
			'an unparseable shelf formula',
			{ shelfForm: { formula: 'MgSO4·7H2O)' } },
			'shelfForm.formula'
		],
		['a basis without formula or molar mass', { basis: {} }, 'basis.formula'],
		['a shelf form without formula when a basis is given', { shelfForm: {} }, 'shelfForm.formula'],
		['two targets', { target: { amount: 1, unit: 'g/L' } }, 'target'],
		[
			'an unknown target unit',
			{ targetGPerL: undefined, target: { amount: 1, unit: 'ppm' } },
			'target.unit'
		]
	])('rejects %s', (_what, change, field) => {
		expect(errorOf(() => computeMassToWeigh({ ...base, ...change })).field).toBe(field);
	});

	it('reports the position of a formula error', () => {
		const error = errorOf(() =>
			computeMassToWeigh({ ...base, shelfForm: { formula: 'MgSO4·7H2O)' } })
		);
		expect(error.position).toBe(10);
	});
});

describe('computeStockVolume', () => {
	it('dilutes a molar stock (C1·V1 = C2·V2)', () => {
		const result = computeStockVolume({
			target: { amount: 2, unit: 'mM' },
			stock: { amount: 1, unit: 'M' },
			volumeL: 0.5
		});
		expect(result.volumeML).toBeCloseTo(1, 12); // 2 mM × 500 mL / 1000 mM
		expect(result.dilutionFactor).toBeCloseTo(500, 9);
	});

	it('dilutes a mass stock', () => {
		const result = computeStockVolume({
			target: { amount: 50, unit: 'mg/L' },
			stock: { amount: 10, unit: 'g/L' },
			volumeL: 1
		});
		expect(result.volumeML).toBeCloseTo(5, 12);
	});

	it('mixes molar and mass units through the molar mass (glucose 180.156 g/mol, IUPAC 2021)', () => {
		const result = computeStockVolume({
			target: { amount: 1, unit: 'mM' },
			stock: { amount: 100, unit: 'g/L' },
			volumeL: 1,
			formula: 'C6H12O6'
		});
		expect(result.volumeML).toBeCloseTo((0.180156 / 100) * 1000, 6);
	});

	it('refuses a stock weaker than the target, and mixed units without a molar mass', () => {
		expect(
			errorOf(() =>
				computeStockVolume({
					target: { amount: 20, unit: 'g/L' },
					stock: { amount: 10, unit: 'g/L' },
					volumeL: 1
				})
			).field
		).toBe('stock.amount');
		expect(
			errorOf(() =>
				computeStockVolume({
					target: { amount: 1, unit: 'mM' },
					stock: { amount: 100, unit: 'g/L' },
					volumeL: 1
				})
			).field
		).toBe('formula');
		expect(
			errorOf(() =>
				computeStockVolume({
					target: { amount: 1, unit: 'mM' },
					stock: { amount: 0, unit: 'M' },
					volumeL: 1
				})
			).field
		).toBe('stock.amount');
		expect(
			errorOf(() =>
				computeStockVolume({
					target: { amount: 1, unit: 'mM' },
					stock: { amount: 1, unit: 'M' },
					volumeL: -2
				})
			).field
		).toBe('volumeL');
		expect(
			errorOf(() =>
				computeStockVolume({
					target: { amount: 1, unit: 'mM' },
					stock: { amount: 1, unit: 'M' },
					volumeL: 1,
					formula: 'Q'
				})
			).field
		).toBe('formula');
	});
});
