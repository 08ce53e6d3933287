import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { MF } from 'mf-parser';
import { ATOMIC_WEIGHTS } from '../../chemistry/data/atomic-weights';
import { ChemistryInputError } from '../../chemistry/errors';
import { DOT_RULE, formulaMolarMass, molarMassOf, parseFormula } from '../../chemistry/formula';
import { errorOf } from './input-error';

describe('atomic weights', () => {
	// IUPAC 2021 standard atomic weights, conventional values for interval elements
	// (Prohaska et al., Pure Appl. Chem. 94:573, 2022), as listed in chemistry/REFERENCES.md.
	const iupac2021: Record<string, number> = {
		H: 1.008,
		C: 12.011,
		N: 14.007,
		O: 15.999,
		Mg: 24.305,
		S: 32.06,
		Cl: 35.45,
		B: 10.81,
		Na: 22.98976928,
		P: 30.973761998,
		K: 39.0983,
		Ca: 40.078,
		Mn: 54.938043,
		Fe: 55.845,
		Co: 58.933194,
		Cu: 63.546,
		Zn: 65.38,
		Se: 78.971,
		Mo: 95.95,
		I: 126.90447
	};
	it.each(Object.entries(iupac2021))('%s is %d (IUPAC 2021)', (symbol, weight) => {
		expect(ATOMIC_WEIGHTS[symbol]).toBe(weight);
	});

	it('covers every element from H to U that has a standard atomic weight', () => {
		// 92 elements H..U less the 8 with no standard atomic weight (Tc, Pm, Po, At, Rn, Fr, Ra, Ac),
		// IUPAC 2021 (Prohaska et al. 2022).
		expect(Object.keys(ATOMIC_WEIGHTS)).toHaveLength(84);
		for (const symbol of ['Tc', 'Pm', 'Po', 'At', 'Rn', 'Fr', 'Ra', 'Ac']) {
			expect(ATOMIC_WEIGHTS[symbol]).toBeUndefined();
		}
	});

	it('agrees with the independent mf-parser element masses within 1e-4 relative for every element', () => {
		for (const [symbol, weight] of Object.entries(ATOMIC_WEIGHTS)) {
			// mf-parser derives masses from NIST isotopic compositions (chemistry/REFERENCES.md).
			const theirs = new MF(symbol).getInfo().mass as number;
			expect(Math.abs(theirs - weight) / weight, symbol).toBeLessThan(2e-4);
		}
	});
});

describe('molar masses', () => {
	// Derived here from IUPAC 2021 weights (chemistry/REFERENCES.md, "D").
	it.each([
		['C6H12O6', 180.156],
		['C3H8O3', 92.094],
		['NaCl', 58.44],
		['KH2PO4', 136.084],
		['MgSO4·7H2O', 246.466],
		['CaCl2·2H2O', 147.008],
		['(NH4)2SO4', 132.134]
	])('%s is %d g/mol (derived, IUPAC 2021)', (formula, expected) => {
		expect(formulaMolarMass(formula)).toBeCloseTo(expected, 3);
	});

	it('CH1.8O0.5N0.2 is 24.626 g per C-mol (Roels 1983 biomass formula; derived, chemistry/REFERENCES.md)', () => {
		expect(formulaMolarMass('CH1.8O0.5N0.2')).toBeCloseTo(24.626, 3);
	});

	// Our formula -> the same compound written for mf-parser (which reads `[` as an isotope and a
	// bare `.7` as a decimal, so it gets `(H2O)n` or ` . `).
	const againstMfParser: [string, string][] = [
		['C6H12O6', 'C6H12O6'],
		['C12H22O11', 'C12H22O11'],
		['C6H12O6·H2O', 'C6H12O6(H2O)'],
		['C3H8O3', 'C3H8O3'],
		['C6H14O6', 'C6H14O6'],
		['NaCl', 'NaCl'],
		['KCl', 'KCl'],
		['KH2PO4', 'KH2PO4'],
		['K2HPO4', 'K2HPO4'],
		['Na2HPO4·7H2O', 'Na2HPO4(H2O)7'],
		['Na2HPO4.12H2O', 'Na2HPO4 . 12H2O'],
		['NaH2PO4·H2O', 'NaH2PO4(H2O)'],
		['(NH4)2SO4', '(NH4)2SO4'],
		['NH4Cl', 'NH4Cl'],
		['MgSO4.7H2O', 'MgSO4(H2O)7'],
		['MgCl2·6H2O', 'MgCl2(H2O)6'],
		['CaCl2*2H2O', 'CaCl2(H2O)2'],
		['NaHCO3', 'NaHCO3'],
		['Na2CO3', 'Na2CO3'],
		['CaCO3', 'CaCO3'],
		['KNO3', 'KNO3'],
		['Na3C6H5O7·2H2O', 'Na3C6H5O7(H2O)2'],
		['FeSO4·7H2O', 'FeSO4(H2O)7'],
		['FeCl3·6H2O', 'FeCl3(H2O)6'],
		['ZnSO4·7H2O', 'ZnSO4(H2O)7'],
		['MnSO4·H2O', 'MnSO4(H2O)'],
		['MnCl2·4H2O', 'MnCl2(H2O)4'],
		['CuSO4.5H2O', 'CuSO4(H2O)5'],
		['CoCl2·6H2O', 'CoCl2(H2O)6'],
		['H3BO3', 'H3BO3'],
		['NiCl2·6H2O', 'NiCl2(H2O)6'],
		['K4[Fe(CN)6]·3H2O', 'K4Fe(CN)6(H2O)3'],
		['Ca(H2PO4)2·H2O', 'Ca(H2PO4)2(H2O)'],
		['C6H14N2O2·HCl', 'C6H14N2O2HCl'],
		['C6H9N3O2·HCl·H2O', 'C6H9N3O2HClH2O'],
		['C9H17NO5·0.5Ca', 'C9H17NO5Ca0.5'],
		['C12H17ClN4OS·HCl', 'C12H17ClN4OSHCl'],
		['C63H88CoN14O14P', 'C63H88CoN14O14P'],
		['C8H18N2O4S', 'C8H18N2O4S'],
		['C4H11NO3', 'C4H11NO3'],
		['KI', 'KI']
	];
	it.each(againstMfParser)('%s agrees with mf-parser within 1e-4 relative', (ours, theirs) => {
		const expected = new MF(theirs).getInfo().mass as number;
		expect(Math.abs(formulaMolarMass(ours) - expected) / expected).toBeLessThan(1e-4);
	});

	it.each([
		['Na2SeO3', 'Na2SeO3'],
		['Na2MoO4·2H2O', 'Na2MoO4(H2O)2'],
		['(NH4)6Mo7O24·4H2O', '(NH4)6Mo7O24(H2O)4']
	])(
		'%s agrees with mf-parser within 0.012 g/mol per Se/Mo atom (NIST vs IUPAC, chemistry/REFERENCES.md)',
		(ours, theirs) => {
			const expected = new MF(theirs).getInfo().mass as number;
			const heavyAtoms =
				(parseFormula(ours).elements.Se ?? 0) + (parseFormula(ours).elements.Mo ?? 0);
			expect(Math.abs(formulaMolarMass(ours) - expected)).toBeLessThan(0.012 * heavyAtoms);
		}
	);

	it('adds the masses of the parts (property)', () => {
		const symbols = ['C', 'H', 'N', 'O', 'S', 'P', 'Na', 'K', 'Cl', 'Mg', 'Ca', 'Fe', 'Zn'];
		const term = fc.tuple(fc.constantFrom(...symbols), fc.integer({ min: 1, max: 20 }));
		fc.assert(
			fc.property(
				fc.array(term, { minLength: 1, maxLength: 6 }),
				fc.integer({ min: 1, max: 12 }),
				(terms, n) => {
					const body = terms.map(([s, c]) => `${s}${c}`).join('');
					const byHand = terms.reduce((sum, [s, c]) => sum + ATOMIC_WEIGHTS[s] * c, 0);
					expect(formulaMolarMass(body)).toBeCloseTo(byHand, 9);
					expect(formulaMolarMass(`${body}·${n}H2O`)).toBeCloseTo(
						byHand + n * (2 * 1.008 + 15.999),
						9
					);
				}
			)
		);
	});

	it('rejects bad element maps', () => {
		expect(() => molarMassOf({})).toThrow(ChemistryInputError);
		expect(() => molarMassOf({ Xx: 1 })).toThrow(/Xx/);
		expect(() => molarMassOf({ C: Number.NaN })).toThrow(/C must be/);
		expect(() => molarMassOf({ C: -1 })).toThrow(/C must be/);
	});
});

describe('parseFormula', () => {
	it('reads nested brackets', () => {
		const parsed = parseFormula('K4[Fe(CN)6]·3H2O');
		expect(parsed.elements).toEqual({ K: 4, Fe: 1, C: 6, N: 6, H: 6, O: 3 });
		expect(parsed.parts).toEqual([
			{ formula: 'K4[Fe(CN)6]', multiplier: 1 },
			{ formula: 'H2O', multiplier: 3 }
		]);
		expect(parseFormula('(NH4)2SO4').elements).toEqual({ N: 2, H: 8, S: 1, O: 4 });
		expect(parseFormula('Ca(H2PO4)2·H2O').elements).toEqual({ Ca: 1, H: 6, P: 2, O: 9 });
		expect(parseFormula('Ca3{[(PO4)]}2').elements).toEqual({ Ca: 3, P: 2, O: 8 });
	});

	it.each([
		'MgSO4·7H2O',
		'MgSO4•7H2O',
		'MgSO4*7H2O',
		'MgSO4 . 7H2O',
		'MgSO4.7H2O',
		'MgSO4 ·7H2O',
		'MgSO4∙7H2O'
	])('reads %s as the heptahydrate', (text) => {
		const parsed = parseFormula(text);
		expect(parsed.reading).toBe('MgSO4·7H2O');
		expect(parsed.elements).toEqual({ Mg: 1, S: 1, O: 11, H: 14 });
		expect(parsed.parts).toEqual([
			{ formula: 'MgSO4', multiplier: 1 },
			{ formula: 'H2O', multiplier: 7 }
		]);
	});

	it.each([
		['CH1.8O0.5N0.2', { C: 1, H: 1.8, O: 0.5, N: 0.2 }],
		['CH1.79O0.5N0.2', { C: 1, H: 1.79, O: 0.5, N: 0.2 }],
		['C1H1.8O0.5', { C: 1, H: 1.8, O: 0.5 }],
		['CH1.8H2O0.5', { C: 1, H: 3.8, O: 0.5 }]
	])('keeps the decimal subscripts of %s', (text, elements) => {
		const parsed = parseFormula(text);
		expect(parsed.elements).toEqual(elements);
		expect(parsed.parts).toHaveLength(1);
		expect(parsed.reading).toBe(text);
	});

	it('reads a plain dot followed by a whole number and H2O/HCl as an adduct', () => {
		expect(parseFormula('CuSO4.5H2O').reading).toBe('CuSO4·5H2O');
		expect(parseFormula('C6H12N2O4S2.2HCl').reading).toBe('C6H12N2O4S2·2HCl');
		expect(parseFormula('C6H14N2O2.HCl').reading).toBe('C6H14N2O2·HCl');
		expect(parseFormula('NaCl.2H2O').reading).toBe('NaCl·2H2O');
		expect(parseFormula('C6H9N3O2.HCl.H2O').parts).toHaveLength(3);
	});

	it('reads decimal and leading multipliers after explicit separators', () => {
		const parsed = parseFormula('Na2HPO4·0.5H2O');
		expect(parsed.parts).toEqual([
			{ formula: 'Na2HPO4', multiplier: 1 },
			{ formula: 'H2O', multiplier: 0.5 }
		]);
		expect(parsed.elements).toEqual({ Na: 2, H: 2, P: 1, O: 4.5 });
		expect(parseFormula('2NaCl').elements).toEqual({ Na: 2, Cl: 2 });
	});

	it('reads Unicode subscripts and keeps the input text', () => {
		const parsed = parseFormula('C₆H₁₂O₆');
		expect(parsed.text).toBe('C₆H₁₂O₆');
		expect(parsed.reading).toBe('C6H12O6');
		expect(parsed.elements).toEqual({ C: 6, H: 12, O: 6 });
	});

	it('distinguishes two-letter symbols by case', () => {
		expect(parseFormula('Co').elements).toEqual({ Co: 1 });
		expect(parseFormula('CO').elements).toEqual({ C: 1, O: 1 });
	});

	it('documents its dot rule for users', () => {
		expect(DOT_RULE).toMatch(/decimal point/);
		expect(DOT_RULE).toMatch(/MgSO4\.7H2O/);
	});

	it.each([
		['', /empty/, 0],
		['   ', /empty/, 0],
		['NaXx2', /Unknown element 'Xx' at position 2/, 2],
		['Ca(OH2', /Unbalanced '\(' at position 2/, 2],
		['NaCl)', /Unbalanced '\)' at position 4/, 4],
		['K4[Fe(CN)6)', /Mismatched '\)' at position 10/, 10],
		['Na Cl', /Unexpected space at position 2/, 2],
		['NaCl!', /Unexpected character '!' at position 4/, 4],
		['nacl', /capital letter/, 0],
		['SO4-2', /charges/, 3],
		['MgSO4·-7H2O', /charges and negative/, 6],
		['H0O', /positive, not 0/, 1],
		['MgSO4·0H2O', /Multiplier at position 6 must be positive/, 6],
		['(H2O)0', /positive, not 0/, 5],
		['MgSO4·7', /Expected a formula after the multiplier at position 6/, 6],
		['MgSO4.', /after the separator/, 5],
		['·H2O', /before the separator/, 0],
		['MgSO4··H2O', /after the separator/, 5],
		['()', /Empty brackets at position 0/, 0],
		['Tc2O7', /no IUPAC standard atomic weight/, 0],
		['Na2HPO4.0.5H2O', /one decimal point/, 9]
	])('rejects %j', (text, message, position) => {
		const error = errorOf(() => parseFormula(text));
		expect(error.message).toMatch(message);
		expect(error.position).toBe(position);
	});

	it('rejects non-text and overlong input', () => {
		expect(() => parseFormula(42 as unknown as string)).toThrow(ChemistryInputError);
		expect(() => parseFormula('C'.repeat(501))).toThrow(/longer than/);
	});

	it('never lets garbage through: any string parses to finite positive counts or throws ChemistryInputError', () => {
		fc.assert(
			fc.property(
				fc.string({
					unit: fc.constantFrom(...'CHONaSKl()[]·.*0123456789 +-xZ'.split('')),
					maxLength: 20
				}),
				(text) => {
					try {
						const { elements } = parseFormula(text);
						for (const n of Object.values(elements)) expect(Number.isFinite(n) && n > 0).toBe(true);
						expect(Number.isFinite(molarMassOf(elements))).toBe(true);
					} catch (e) {
						expect(e).toBeInstanceOf(ChemistryInputError);
					}
				}
			)
		);
	});
});
