import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	type ComponentSpec,
	REFERENCE_COMPONENTS,
	findReferenceComponent
} from '../../chemistry/components';
import {
	REPORTED_ELEMENTS,
	computeComposition,
	type CompositionLine
} from '../../chemistry/composition';
import {
	CONCENTRATION_UNITS,
	convertConcentration,
	normalizeConcentrationUnit
} from '../../chemistry/units';
import { errorOf } from './input-error';

// IUPAC 2021 standard atomic weights, conventional values (Prohaska et al., Pure Appl. Chem. 94:573, 2022).
const W = {
	H: 1.008,
	C: 12.011,
	N: 14.007,
	O: 15.999,
	Na: 22.98976928,
	P: 30.973761998,
	S: 32.06,
	Cl: 35.45,
	K: 39.0983,
	Mg: 24.305,
	Ca: 40.078
};

function component(id: string) {
	const found = findReferenceComponent(id);
	if (!found) throw new Error(`no reference component ${id}`);
	return found;
}

function element(result: ReturnType<typeof computeComposition>, symbol: string) {
	const found = result.elements.find((e) => e.symbol === symbol);
	if (!found) throw new Error(`no ${symbol}`);
	return found;
}

describe('osmolality and ionic strength', () => {
	const saline = computeComposition({
		lines: [{ component: component('sodium-chloride'), amount: 0.9, unit: '% w/v' }]
	});

	it('puts 0.9 % w/v NaCl at about 286 mOsm/kg', () => {
		// 286 mOsm/kg: 2 × 154 mM × φ 0.93 (chemistry/REFERENCES.md, Osmolality, "D"; 286 is the usual measured value, from memory).
		expect(Math.abs(saline.osmolality.estimateMOsmPerKg - 286) / 286).toBeLessThan(0.03);
		// Ideal 308 mOsm/L (chemistry/REFERENCES.md, Osmolality, "C").
		expect(saline.osmolality.idealMOsmPerL).toBeCloseTo(308, 0);
		expect(saline.components[0].osmoticCoefficient).toBe(0.93);
		expect(saline.osmolality.note).toMatch(/estimate/);
		expect(saline.osmolality.note).toMatch(/mOsm\/L is taken as mOsm\/kg/);
	});

	it('gives its ionic strength as ½ Σ c z²', () => {
		const molar = 9 / (W.Na + W.Cl); // mol/L, by hand
		expect(saline.ionicStrengthMolPerL).toBeCloseTo(0.5 * (molar * 1 + molar * 1), 9);
		const mgso4 = computeComposition({
			lines: [{ component: component('magnesium-sulfate'), amount: 10, unit: 'mM' }]
		});
		expect(mgso4.ionicStrengthMolPerL).toBeCloseTo(0.5 * (0.01 * 4 + 0.01 * 4), 12); // 2:2 salt, by hand
	});

	it('counts non-electrolytes once and leaves complex materials out, naming them', () => {
		const result = computeComposition({
			lines: [
				{ component: component('d-glucose'), amount: 10, unit: 'mM' },
				{ component: component('yeast-extract'), amount: 5, unit: 'g/L' }
			]
		});
		expect(result.osmolality.estimateMOsmPerKg).toBeCloseTo(10 * 1.01, 9); // glucose φ 1.01 (chemistry/REFERENCES.md)
		expect(result.osmolality.excludedComponentIds).toEqual(['yeast-extract']);
		expect(result.components[1].osmolalityMOsmPerKg).toBeNull();
	});
});

describe('element sums', () => {
	it('gets 0.4 g/L carbon from 1 g/L glucose (72.066/180.156, IUPAC 2021)', () => {
		const result = computeComposition({
			lines: [{ component: component('d-glucose'), amount: 1, unit: 'g/L' }]
		});
		expect(result.totalCarbonGPerL).toBeCloseTo(72.066 / 180.156, 9);
		expect(element(result, 'C').mmolPerL).toBeCloseTo((6 * 1000) / 180.156, 6);
		expect(element(result, 'H').gPerL).toBeCloseTo((12 * W.H) / 180.156, 9);
		expect(result.components[0].mM).toBeCloseTo(1000 / 180.156, 6);
	});

	it('adds potassium, phosphorus and nitrogen across salts', () => {
		const result = computeComposition({
			lines: [
				{ component: component('potassium-dihydrogen-phosphate'), amount: 1, unit: 'g/L' },
				{ component: component('dipotassium-hydrogen-phosphate'), amount: 1, unit: 'g/L' },
				{ component: component('ammonium-sulfate'), amount: 2, unit: 'g/L' }
			]
		});
		const mKH2PO4 = W.K + 2 * W.H + W.P + 4 * W.O;
		const mK2HPO4 = 2 * W.K + W.H + W.P + 4 * W.O;
		const mAmSulf = 2 * (W.N + 4 * W.H) + W.S + 4 * W.O;
		expect(element(result, 'K').gPerL).toBeCloseTo(W.K / mKH2PO4 + (2 * W.K) / mK2HPO4, 9);
		expect(element(result, 'P').mmolPerL).toBeCloseTo(1000 / mKH2PO4 + 1000 / mK2HPO4, 6);
		expect(result.totalNitrogenGPerL).toBeCloseTo((2 * 2 * W.N) / mAmSulf, 9);
		expect(element(result, 'S').gPerL).toBeCloseTo((2 * W.S) / mAmSulf, 9);
	});

	it('takes complex materials from their mass fractions', () => {
		const yeast = component('yeast-extract');
		const result = computeComposition({ lines: [{ component: yeast, amount: 5, unit: 'g/L' }] });
		expect(result.totalNitrogenGPerL).toBeCloseTo(
			5 * (yeast.elementalMassFractions?.N as number),
			12
		);
		expect(result.components[0].mM).toBeNull();
	});

	it('lists the usual elements in order, at zero when absent, then any others', () => {
		const result = computeComposition({
			lines: [
				{ component: component('nickel-ii-chloride-hexahydrate'), amount: 1, unit: 'µM' },
				{ component: component('boric-acid'), amount: 1, unit: 'µM' }
			]
		});
		expect(result.elements.map((e) => e.symbol)).toEqual([...REPORTED_ELEMENTS, 'B', 'Ni']);
		expect(element(result, 'Fe').gPerL).toBe(0);
		expect(element(result, 'Ni').mmolPerL).toBeCloseTo(0.001, 12);
	});

	it('keeps mass: element masses add up to the component masses (property)', () => {
		const defined = REFERENCE_COMPONENTS.filter((c) => c.formula);
		fc.assert(
			fc.property(
				fc.uniqueArray(fc.integer({ min: 0, max: defined.length - 1 }), {
					minLength: 1,
					maxLength: 20
				}),
				fc.array(fc.double({ min: 1e-4, max: 100, noNaN: true }), { minLength: 20, maxLength: 20 }),
				(indexes, amounts) => {
					const lines = indexes.map((i, k) => ({
						component: defined[i],
						amount: amounts[k],
						unit: 'g/L'
					}));
					const result = computeComposition({ lines });
					const componentTotal = result.components.reduce((s, c) => s + c.gPerL, 0);
					const elementTotal = result.elements.reduce((s, e) => s + e.gPerL, 0);
					expect(Math.abs(elementTotal - componentTotal) / componentTotal).toBeLessThan(1e-9);
				}
			),
			{ numRuns: 50 }
		);
	});

	it('gives the mass each component needs for a batch volume', () => {
		const result = computeComposition({
			volumeL: 2.5,
			lines: [{ component: component('sodium-chloride'), amount: 6.4, unit: 'g/L' }]
		});
		expect(result.components[0].massG).toBeCloseTo(16, 12);
	});

	it('sums the dissolved solids as weighed, hydrate water included', () => {
		// 6 g/L NaCl + 20 mM glucose (20 × 180.156 / 1000 = 3.603 g/L) + 1 g/L MgSO4·7H2O = 10.603 g/L.
		const result = computeComposition({
			lines: [
				{ component: component('sodium-chloride'), amount: 6, unit: 'g/L' },
				{ component: component('d-glucose'), amount: 20, unit: 'mM' },
				{ component: component('magnesium-sulfate-heptahydrate'), amount: 1, unit: 'g/L' }
			]
		});
		expect(result.dissolvedSolidsGPerL).toBeCloseTo(
			6 + (20 * (6 * W.C + 12 * W.H + 6 * W.O)) / 1000 + 1,
			9
		);
	});
});

describe('units', () => {
	it.each([
		['g/L', 0.246466],
		['mg/L', 246.466],
		['mM', 1],
		['µM', 1000],
		['uM', 1000],
		['μM', 1000], // Greek mu
		['% w/v', 0.0246466],
		['%w/v', 0.0246466],
		['% (w/v)', 0.0246466],
		['mmol/L', 1]
	])('reads %s through mathjs (MgSO4·7H2O 246.466 g/mol, IUPAC 2021)', (unit, amount) => {
		const result = computeComposition({
			lines: [{ component: component('magnesium-sulfate-heptahydrate'), amount, unit }]
		});
		expect(result.components[0].mM).toBeCloseTo(1, 9);
		expect(result.components[0].gPerL).toBeCloseTo(0.246466, 6);
	});

	it('converts between units', () => {
		expect(convertConcentration(0.9, '% w/v', 'g/L')).toBeCloseTo(9, 12);
		expect(convertConcentration(5, 'mM', 'µM')).toBeCloseTo(5000, 9);
		expect(convertConcentration(180.156, 'mg/L', 'mM', 180.156)).toBeCloseTo(1, 12);
		expect(normalizeConcentrationUnit(' g / l ')).toBe('g/L');
	});

	it.each(['mm', 'MM', 'mmol', 'ppm', '%', 'g', 'kg/L'])(
		'refuses %j and lists the accepted units',
		(unit) => {
			const error = errorOf(() => normalizeConcentrationUnit(unit, 'lines.0.unit'));
			expect(error.field).toBe('lines.0.unit');
			for (const accepted of CONCENTRATION_UNITS) expect(error.message).toContain(accepted);
		}
	);
});

describe('warnings', () => {
	it('flags L-tyrosine at 2 g/L above its solubility (CRC amino-acid table, ≈ 0.45 g/L at 25 °C, from memory)', () => {
		const result = computeComposition({
			lines: [{ component: component('l-tyrosine'), amount: 2, unit: 'g/L' }]
		});
		expect(result.warnings).toHaveLength(1);
		expect(result.warnings[0]).toMatchObject({
			kind: 'solubility',
			basis: 'published value',
			componentIds: ['l-tyrosine'],
			lineIndexes: [0]
		});
		expect(result.warnings[0].message).toMatch(/0\.453 g\/L at 25 °C/);
		expect(
			computeComposition({
				lines: [{ component: component('l-tyrosine'), amount: 0.3, unit: 'g/L' }]
			}).warnings
		).toEqual([]);
	});

	it('lowers the limit at a cold preparation temperature', () => {
		// 0.196 g/L at 0 °C and 0.453 g/L at 25 °C (CRC amino-acid table, from memory): 0.3 g/L fails at 4 °C.
		const cold = computeComposition({
			temperatureC: 4,
			lines: [{ component: component('l-tyrosine'), amount: 0.3, unit: 'g/L' }]
		});
		expect(cold.warnings.map((w) => w.kind)).toEqual(['solubility']);
		expect(cold.warnings[0].message).toMatch(/interpolated/);
	});

	it('checks a hydrate on its anhydrous basis', () => {
		// 100 g/L Na2HPO4·12H2O is 100 × 141.96/358.14 ≈ 39.6 g/L Na2HPO4 (IUPAC 2021 masses): below 118 g/L at 25 °C,
		// above ≈ 17 g/L at 0 °C (CRC, from memory).
		const line = {
			component: component('disodium-hydrogen-phosphate-dodecahydrate'),
			amount: 100,
			unit: 'g/L'
		};
		expect(computeComposition({ lines: [line] }).warnings).toEqual([]);
		const cold = computeComposition({ temperatureC: 2, lines: [line] });
		expect(cold.warnings[0].message).toMatch(/39\.6 g\/L as the anhydrous\/basis form/);
	});

	it('says when no temperature dependence is known', () => {
		const result = computeComposition({
			temperatureC: 4,
			lines: [{ component: component('l-leucine'), amount: 30, unit: 'g/L' }]
		});
		expect(result.warnings[0].message).toMatch(/no temperature dependence known/);
		expect(result.warnings[0].message).toMatch(/at 25 °C/);
	});

	it('flags calcium with phosphate as common practice, naming the concentrations', () => {
		const result = computeComposition({
			lines: [
				{ component: component('calcium-chloride-dihydrate'), amount: 2, unit: 'mM' },
				{ component: component('sodium-chloride'), amount: 100, unit: 'mM' },
				{ component: component('disodium-hydrogen-phosphate'), amount: 3, unit: 'mM' }
			]
		});
		const warning = result.warnings.find((w) => w.kind === 'precipitation');
		expect(warning).toMatchObject({
			basis: 'common practice',
			lineIndexes: [0, 2],
			precipitate: 'calcium phosphate'
		});
		expect(warning?.message).toMatch(/Ca 2 mM with phosphate 3 mM/);
		expect(warning?.message).toMatch(/common practice/);
	});

	it('stays quiet below the thresholds', () => {
		const result = computeComposition({
			lines: [
				{ component: component('calcium-chloride-dihydrate'), amount: 0.5, unit: 'mM' },
				{ component: component('disodium-hydrogen-phosphate'), amount: 3, unit: 'mM' }
			]
		});
		expect(result.warnings).toEqual([]);
	});

	it('flags iron salts with phosphate but not chelated iron', () => {
		const phosphate = {
			component: component('potassium-dihydrogen-phosphate'),
			amount: 5,
			unit: 'mM'
		};
		const free = computeComposition({
			lines: [
				phosphate,
				{ component: component('iron-ii-sulfate-heptahydrate'), amount: 50, unit: 'µM' }
			]
		});
		expect(free.warnings.map((w) => w.message)).toEqual([expect.stringMatching(/iron phosphate/)]);
		const chelated = computeComposition({
			lines: [
				phosphate,
				{ component: component('ferric-ammonium-citrate'), amount: 10, unit: 'mg/L' }
			]
		});
		expect(chelated.warnings).toEqual([]);
	});

	it('flags calcium with bicarbonate', () => {
		const result = computeComposition({
			lines: [
				{ component: component('calcium-chloride'), amount: 1.8, unit: 'mM' },
				{ component: component('sodium-bicarbonate'), amount: 3.7, unit: 'g/L' }
			]
		});
		expect(result.warnings.map((w) => w.message)).toEqual([
			expect.stringMatching(/calcium carbonate/)
		]);
	});
});

describe('bad input', () => {
	const nacl = component('sodium-chloride');
	const glucose = component('d-glucose');

	it.each<[string, CompositionLine[], string]>([
		[
			'a negative amount',
			[
				{ component: glucose, amount: 1, unit: 'g/L' },
				{ component: nacl, amount: -1, unit: 'g/L' }
			],
			'lines.1.amount'
		],
		['a zero amount', [{ component: nacl, amount: 0, unit: 'g/L' }], 'lines.0.amount'],
		['a NaN amount', [{ component: nacl, amount: Number.NaN, unit: 'g/L' }], 'lines.0.amount'],
		[
			'an infinite amount',
			[{ component: nacl, amount: Number.POSITIVE_INFINITY, unit: 'g/L' }],
			'lines.0.amount'
		],
		['an unknown unit', [{ component: nacl, amount: 1, unit: 'mmol' }], 'lines.0.unit'],
		[
			'a molar unit without a molar mass',
			[{ component: component('yeast-extract'), amount: 1, unit: 'mM' }],
			'lines.0.unit'
		],
		[
			'a duplicate line',
			[
				{ component: nacl, amount: 1, unit: 'g/L' },
				{ component: glucose, amount: 1, unit: 'g/L' },
				{ component: { ...nacl }, amount: 2, unit: 'mM' }
			],
			'lines.2.component'
		],
		[
			'an unparseable formula',
			[
				{ component: glucose, amount: 1, unit: 'g/L' },
				{
					component: { id: 'db-1', name: 'Typo', formula: 'C6H12O6)' } as ComponentSpec,
					amount: 1,
					unit: 'g/L'
				}
			],
			'lines.1.component.formula'
		]
	])('rejects %s with its field path', (_what, lines, field) => {
		expect(errorOf(() => computeComposition({ lines })).field).toBe(field);
	});

	it('gives the position of a formula error', () => {
		const error = errorOf(() =>
			computeComposition({
				lines: [
					{ component: { id: 'db-1', name: 'Typo', formula: 'C6H12O6)' }, amount: 1, unit: 'g/L' }
				]
			})
		);
		expect(error.position).toBe(7);
		expect(error.message).toMatch(/Unbalanced/);
	});

	it('rejects bad temperature, volume and lines', () => {
		const lines = [{ component: nacl, amount: 1, unit: 'g/L' }];
		expect(errorOf(() => computeComposition({ lines, temperatureC: Number.NaN })).field).toBe(
			'temperatureC'
		);
		expect(errorOf(() => computeComposition({ lines, temperatureC: 150 })).field).toBe(
			'temperatureC'
		);
		expect(errorOf(() => computeComposition({ lines, volumeL: 0 })).field).toBe('volumeL');
		expect(
			errorOf(() => computeComposition({ lines: 'NaCl' as unknown as CompositionLine[] })).field
		).toBe('lines');
	});

	it('returns zeros for an empty recipe', () => {
		const result = computeComposition({ lines: [] });
		expect(result.osmolality.estimateMOsmPerKg).toBe(0);
		expect(result.elements.every((e) => e.gPerL === 0)).toBe(true);
	});
});
