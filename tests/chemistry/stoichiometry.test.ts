import { describe, expect, it } from 'vitest';
import { computeDegreeOfReduction } from '../../chemistry/degree-of-reduction';
import { computeChiSquareQuantile } from '../../chemistry/statistics';
import {
	solveStoichiometry,
	type StoichiometrySpecies,
	type StoichiometrySpecification
} from '../../chemistry/stoichiometry';
import { errorOf } from './input-error';

// The worked growth balance of Shuler & Kargi, Bioprocess Engineering, 2nd ed. (2002) — location
// from memory, as in chemistry/REFERENCES.md:
// C6H12O6 + 3 O2 + 0.48 NH3 → 0.48 C6H10NO3 + 4.32 H2O + 3.12 CO2; Yx/s 0.384, Yx/O2 0.721, RQ 1.04.
const shulerKargi: StoichiometrySpecies[] = [
	{ id: 'glucose', formula: 'C6H12O6', role: 'substrate' },
	{ id: 'O2', formula: 'O2' },
	{ id: 'NH3', formula: 'NH3' },
	{ id: 'biomass', formula: 'C6H10NO3', role: 'biomass' },
	{ id: 'H2O', formula: 'H2O' },
	{ id: 'CO2', formula: 'CO2' }
];

describe('degree of reduction (C +4, H +1, O −2, N −3 with NH3 as reference)', () => {
	// Values from chemistry/REFERENCES.md (convention from memory, values derived).
	it.each([
		['C6H12O6', 4],
		['C3H8O3', 4.667],
		['CH4O', 6],
		['C2H6O', 6],
		['C2H4O2', 4],
		['C3H6O3', 4],
		['CO2', 0],
		['CH1.8O0.5N0.2', 4.2]
	])('%s has γ = %d per C-mol', (formula, gamma) => {
		expect(computeDegreeOfReduction(formula).value).toBeCloseTo(gamma, 3);
		expect(computeDegreeOfReduction(formula).basis).toBe('perCmol');
	});

	it('gives biomass 4.8 with N2 and 5.8 with nitrate as nitrogen reference', () => {
		expect(
			computeDegreeOfReduction('CH1.8O0.5N0.2', { nitrogenReference: 'dinitrogen' }).value
		).toBeCloseTo(4.8, 10);
		expect(
			computeDegreeOfReduction('CH1.8O0.5N0.2', { nitrogenReference: 'nitrate' }).value
		).toBeCloseTo(5.8, 10);
	});

	it('gives the average biomass CH1.79O0.50N0.20 γ = 4.19 (Roels 1983, as tabulated by Doran)', () => {
		expect(computeDegreeOfReduction('CH1.79O0.5N0.2').value).toBeCloseTo(4.19, 2);
	});

	it('reports per mole for species without carbon: O2 −4, NH3 0, H2O 0', () => {
		expect(computeDegreeOfReduction('O2')).toMatchObject({ value: -4, basis: 'perMol' });
		expect(computeDegreeOfReduction('NH3').value).toBe(0);
		expect(computeDegreeOfReduction('H2O').value).toBe(0);
	});

	it('refuses elements the convention has no valence for', () => {
		const e = errorOf(() => computeDegreeOfReduction('NaCl'));
		expect(e.message).toContain('Na');
	});
});

describe('Shuler & Kargi worked growth balance', () => {
	it('closes with glucose −1 and O2 −3 to the published coefficients and yields', () => {
		const r = solveStoichiometry({
			species: shulerKargi,
			specifications: [
				{ kind: 'rate', species: 'glucose', mol: -1 },
				{ kind: 'rate', species: 'O2', mol: -3 }
			]
		});
		expect(r.degreesOfFreedom).toBe(2);
		expect(r.redundancy).toBe(0);
		expect(r.rates.NH3.mol).toBeCloseTo(-0.48, 10);
		// Biomass is per C-mol: 0.48 mol C6H10NO3 = 2.88 C-mol.
		expect(r.rates.biomass.mol).toBeCloseTo(2.88, 10);
		expect(r.rates.H2O.mol).toBeCloseTo(4.32, 10);
		expect(r.rates.CO2.mol).toBeCloseTo(3.12, 10);
		expect(r.yields.biomassOnSubstrateGPerG).toBeCloseTo(0.384, 3);
		expect(r.yields.biomassOnOxygenGPerG).toBeCloseTo(0.721, 3);
		expect(r.yields.respiratoryQuotient).toBeCloseTo(1.04, 10);
		expect(r.electronBalance.closes).toBe(true);
		// γ of C6H10NO3 per C-mol = (24 + 10 − 6 − 3) / 6 = 4.1667
		expect(r.degreesOfReduction.biomass).toBeCloseTo(25 / 6, 10);
	});

	it('recovers O2 ≈ 3 mol and RQ ≈ 1.04 from the yield 0.384 g/g', () => {
		const r = solveStoichiometry({
			species: shulerKargi,
			specifications: [
				{ kind: 'rate', species: 'glucose', mol: -1 },
				{ kind: 'massYield', product: 'biomass', substrate: 'glucose', gPerG: 0.384 }
			]
		});
		// 0.384 is rounded to 3 digits, so the coefficients agree to about 1e-3 relative.
		expect(r.rates.O2.mol).toBeCloseTo(-3, 2);
		expect(r.yields.respiratoryQuotient).toBeCloseTo(1.04, 2);
		expect(r.yields.biomassOnOxygenGPerG).toBeCloseTo(0.721, 2);
		expect(r.rates.glucose.g).toBeCloseTo(-180.156, 6); // IUPAC 2021 glucose
		expect(r.roles).toMatchObject({
			O2: 'oxygen',
			CO2: 'carbonDioxide',
			H2O: 'water',
			NH3: 'nitrogen'
		});
	});
});

describe('biomass per C-mol and ash', () => {
	const species = (ashFraction: number): StoichiometrySpecies[] => [
		{ id: 'glucose', formula: 'C6H12O6' },
		{ id: 'O2', formula: 'O2' },
		{ id: 'NH3', formula: 'NH3' },
		{ id: 'X', formula: 'CH1.8O0.5N0.2', ashFraction },
		{ id: 'H2O', formula: 'H2O' },
		{ id: 'CO2', formula: 'CO2' }
	];

	it('uses 24.626 g per C-mol for CH1.8O0.5N0.2 and 24.626/(1 − a) with ash', () => {
		// Roels 1983; Heijnen — 24.626 g/C-mol ash-free (D), 24.626/(1 − a) with ash (chemistry/REFERENCES.md).
		const specs: StoichiometrySpecification[] = [
			{ kind: 'rate', species: 'glucose', mol: -1 },
			{ kind: 'rate', species: 'O2', mol: -2 }
		];
		const ashFree = solveStoichiometry({ species: species(0), specifications: specs });
		const ash = solveStoichiometry({ species: species(0.08), specifications: specs });
		expect(ashFree.molarMasses.X).toBeCloseTo(24.626, 3);
		expect(ash.molarMasses.X).toBeCloseTo(24.626 / 0.92, 3);
		// Ash carries no C, H, O, N: the same C-mol, 1/(1 − a) more grams.
		expect(ash.rates.X.mol).toBeCloseTo(ashFree.rates.X.mol, 12);
		expect(ash.rates.X.g / ashFree.rates.X.g).toBeCloseTo(1 / 0.92, 12);
	});

	it('normalises a biomass formula written per C6 to one C-mol', () => {
		const r = solveStoichiometry({
			species: [
				...shulerKargi.slice(0, 3),
				{ id: 'biomass', formula: 'C6H10NO3', ashFraction: 0 },
				...shulerKargi.slice(4)
			],
			specifications: [
				{ kind: 'rate', species: 'glucose', mol: -1 },
				{ kind: 'rate', species: 'O2', mol: -3 }
			]
		});
		// 144.152 g/mol C6H10NO3 / 6 = 24.025 g/C-mol
		expect(r.molarMasses.biomass).toBeCloseTo(144.152 / 6, 3);
		expect(r.rates.biomass.cmol).toBeCloseTo(2.88, 10);
	});

	it('meets the regularity of ≈ 3 g dry biomass per electron-equivalent of substrate', () => {
		// Mayberry, Prochazka & Payne (1967): ≈ 3 g per mol of available electrons. With a typical aerobic
		// glucose yield of 0.5 g/g (common practice) the solved balance must land in a loose 2–4.5 g/eq
		// band — the regularity scatters with organism and conditions, so only the order is checked.
		const r = solveStoichiometry({
			species: species(0.05),
			specifications: [
				{ kind: 'rate', species: 'glucose', mol: -1 },
				{ kind: 'massYield', product: 'X', substrate: 'glucose', gPerG: 0.5 }
			]
		});
		const substrateElectrons = -r.degreesOfReduction.glucose * (r.rates.glucose.cmol ?? 0);
		const gPerElectron = r.rates.X.g / substrateElectrons;
		expect(substrateElectrons).toBeCloseTo(24, 10);
		expect(gPerElectron).toBeGreaterThan(2);
		expect(gPerElectron).toBeLessThan(4.5);
	});
});

describe('products, P and S, and the electron balance', () => {
	it('balances an anaerobic ethanol fermentation and splits the substrate electrons', () => {
		const r = solveStoichiometry({
			species: [
				{ id: 'glucose', formula: 'C6H12O6' },
				{ id: 'NH3', formula: 'NH3' },
				{ id: 'X', formula: 'CH1.8O0.5N0.2', ashFraction: 0.05 },
				{ id: 'ethanol', formula: 'C2H6O', role: 'product' },
				{ id: 'CO2', formula: 'CO2' },
				{ id: 'H2O', formula: 'H2O' }
			],
			specifications: [
				{ kind: 'rate', species: 'glucose', mol: -1 },
				{ kind: 'massYield', product: 'X', substrate: 'glucose', gPerG: 0.1 }
			]
		});
		// Electron balance: 24 = 4.2·r_X + 12·r_EtOH (γ_EtOH = 6 per C-mol, 12 per mol).
		const fromElectrons = (24 - 4.2 * r.rates.X.mol) / 12;
		expect(r.rates.ethanol.mol).toBeCloseTo(fromElectrons, 10);
		expect(r.electronBalance.fractions.X + r.electronBalance.fractions.ethanol).toBeCloseTo(1, 10);
		expect(r.yields.perSubstrate.glucose.productsGPerG.ethanol).toBeGreaterThan(0.4);
		expect(r.yields.biomassOnOxygenGPerG).toBeNull();
	});

	it('balances P and S when asked, with phosphate and sulfate as sources', () => {
		const r = solveStoichiometry({
			species: [
				{ id: 'glucose', formula: 'C6H12O6' },
				{ id: 'O2', formula: 'O2' },
				{ id: 'NH3', formula: 'NH3' },
				{ id: 'H3PO4', formula: 'H3PO4', role: 'substrate' },
				{ id: 'H2SO4', formula: 'H2SO4', role: 'substrate' },
				{ id: 'X', formula: 'CH1.8O0.5N0.2P0.02S0.005', ashFraction: 0.06 },
				{ id: 'H2O', formula: 'H2O' },
				{ id: 'CO2', formula: 'CO2' }
			],
			elements: ['C', 'H', 'O', 'N', 'P', 'S'],
			specifications: [
				{ kind: 'rate', species: 'glucose', mol: -1 },
				{ kind: 'massYield', product: 'X', substrate: 'glucose', gPerG: 0.45 }
			]
		});
		expect(r.rates.H3PO4.mol).toBeCloseTo(-0.02 * r.rates.X.mol, 12);
		expect(r.rates.H2SO4.mol).toBeCloseTo(-0.005 * r.rates.X.mol, 12);
		for (const residual of Object.values(r.elementResiduals))
			expect(Math.abs(residual)).toBeLessThan(1e-12);
		expect(r.electronBalance.closes).toBe(true);
		// P +5 and S +6 make phosphate and sulfate references: γ = 0.
		expect(r.degreesOfReduction.H3PO4).toBeCloseTo(0, 12);
		expect(r.degreesOfReduction.H2SO4).toBeCloseTo(0, 12);
	});

	it('notes elements in a formula that are not balanced', () => {
		const r = solveStoichiometry({
			species: [
				...shulerKargi.slice(0, 3),
				{ id: 'biomass', formula: 'CH1.8O0.5N0.2P0.02', role: 'biomass' },
				...shulerKargi.slice(4)
			],
			specifications: [
				{ kind: 'rate', species: 'glucose', mol: -1 },
				{ kind: 'rate', species: 'O2', mol: -2 }
			]
		});
		expect(r.notes.join(' ')).toContain('P');
	});
});

describe('too few, redundant and contradictory specifications', () => {
	it('says how many more specifications are needed and on which rates', () => {
		const e = errorOf(() =>
			solveStoichiometry({
				species: shulerKargi,
				specifications: [{ kind: 'rate', species: 'glucose', mol: -1 }]
			})
		);
		expect(e.field).toBe('specifications');
		expect(e.message).toMatch(/^1 more specification is needed/);
		expect(e.message).toContain('O2 or CO2');

		const withProduct = [
			...shulerKargi,
			{ id: 'acetate', formula: 'C2H4O2', role: 'product' as const }
		];
		const two = errorOf(() =>
			solveStoichiometry({
				species: withProduct,
				specifications: [{ kind: 'rate', species: 'glucose', mol: -1 }]
			})
		);
		expect(two.message).toMatch(/^2 more specifications are needed/);
		expect(
			errorOf(() => solveStoichiometry({ species: shulerKargi, specifications: [] })).message
		).toMatch(/^2 specifications are needed/);
	});

	it('asks for a rate when only ratios are given', () => {
		const e = errorOf(() =>
			solveStoichiometry({
				species: shulerKargi,
				specifications: [
					{ kind: 'massYield', product: 'biomass', substrate: 'glucose', gPerG: 0.384 }
				]
			})
		);
		expect(e.message).toContain('scale');
		expect(e.message).toContain("kind: 'rate'");
	});

	it('finds redundant but consistent specifications consistent, with the same answer', () => {
		const r = solveStoichiometry({
			species: shulerKargi,
			specifications: [
				{ kind: 'rate', species: 'glucose', mol: -1 },
				{ kind: 'rate', species: 'O2', mol: -3 },
				{ kind: 'molarRatio', numerator: 'CO2', denominator: 'O2', value: 1.04 }
			]
		});
		expect(r.redundancy).toBe(1);
		expect(r.consistency?.consistent).toBe(true);
		expect(r.consistency?.chiSquare).toBeLessThan(1e-12);
		expect(r.rates.biomass.mol).toBeCloseTo(2.88, 8);
	});

	it('finds an RQ that contradicts the yield inconsistent', () => {
		// With Yx/s 0.384 the balance forces RQ ≈ 1.04; an RQ of 1.5 is 44 % off, far beyond 5 % errors.
		const r = solveStoichiometry({
			species: shulerKargi,
			specifications: [
				{ kind: 'rate', species: 'glucose', mol: -1 },
				{ kind: 'massYield', product: 'biomass', substrate: 'glucose', gPerG: 0.384 },
				{ kind: 'molarRatio', numerator: 'CO2', denominator: 'O2', value: 1.5 }
			]
		});
		expect(r.redundancy).toBe(1);
		expect(r.consistency?.consistent).toBe(false);
		expect(r.consistency?.chiSquare).toBeGreaterThan(r.consistency?.threshold ?? Infinity);
		expect(r.consistency?.pValue).toBeLessThan(0.05);
		// Element balances still hold exactly in the least-squares answer.
		for (const residual of Object.values(r.elementResiduals))
			expect(Math.abs(residual)).toBeLessThan(1e-12);
	});

	it('uses χ² quantiles 3.841 (1 dof) and 5.991 (2 dof) at 95 %', () => {
		// 1 dof: the two-sided 95 % normal quantile squared, 1.959964² = 3.84146; 2 dof: χ²₂ is
		// exponential with mean 2, so the quantile is −2 ln 0.05 = 5.99146.
		expect(computeChiSquareQuantile(0.95, 1)).toBeCloseTo(1.959964 ** 2, 4);
		expect(computeChiSquareQuantile(0.95, 2)).toBeCloseTo(-2 * Math.log(0.05), 8);
		expect(computeChiSquareQuantile(0.5, 2)).toBeCloseTo(2 * Math.log(2), 8);
	});

	it('refuses a yield above what the substrate electrons allow (O2 would be produced)', () => {
		const e = errorOf(() =>
			solveStoichiometry({
				species: shulerKargi,
				specifications: [
					{ kind: 'rate', species: 'glucose', mol: -1 },
					{ kind: 'massYield', product: 'biomass', substrate: 'glucose', gPerG: 1.2 }
				]
			})
		);
		expect(e.message).toContain("'O2' comes out produced");
	});

	it('refuses two different rates for one species and a rate of the wrong sign', () => {
		const twice = errorOf(() =>
			solveStoichiometry({
				species: shulerKargi,
				specifications: [
					{ kind: 'rate', species: 'glucose', mol: -1 },
					{ kind: 'rate', species: 'glucose', mol: -2 }
				]
			})
		);
		expect(twice.field).toBe('specifications.1.mol');
		const sign = errorOf(() =>
			solveStoichiometry({
				species: shulerKargi,
				specifications: [{ kind: 'rate', species: 'O2', mol: 3 }]
			})
		);
		expect(sign.field).toBe('specifications.0.mol');
		expect(sign.message).toContain('negative');
	});

	it('names the field of an unknown species, a bad formula and a bad element', () => {
		const unknown = errorOf(() =>
			solveStoichiometry({
				species: shulerKargi,
				specifications: [
					{ kind: 'rate', species: 'glucose', mol: -1 },
					{ kind: 'rate', species: 'O2', mol: -3 },
					{ kind: 'rate', species: 'lactate', mol: 1 }
				]
			})
		);
		expect(unknown.field).toBe('specifications.2.species');
		expect(unknown.message).toContain('lactate');
		const ratio = errorOf(() =>
			solveStoichiometry({
				species: shulerKargi,
				specifications: [{ kind: 'molarRatio', numerator: 'CO2', denominator: 'oxygen', value: 1 }]
			})
		);
		expect(ratio.field).toBe('specifications.0.denominator');
		const formula = errorOf(() =>
			solveStoichiometry({
				species: [shulerKargi[0], { id: 'bad', formula: 'C6H12Xx' }],
				specifications: []
			})
		);
		expect(formula.field).toBe('species.1.formula');
		expect(formula.position).toBe(5);
		const onlyOne = errorOf(() =>
			solveStoichiometry({
				species: shulerKargi,
				elements: ['C', 'H', 'O', 'N', 'P'],
				specifications: []
			})
		);
		expect(onlyOne.field).toBe('elements.4');
		const potassium = errorOf(() =>
			solveStoichiometry({ species: shulerKargi, elements: ['C', 'K'], specifications: [] })
		);
		expect(potassium.field).toBe('elements.1');
		const duplicate = errorOf(() =>
			solveStoichiometry({
				species: [shulerKargi[0], { id: 'glucose', formula: 'O2' }],
				specifications: []
			})
		);
		expect(duplicate.field).toBe('species.1.id');
	});

	it('flags balances where the elements alone force every rate to zero', () => {
		const e = errorOf(() =>
			solveStoichiometry({
				// Glucose, CO2 and H2O without O2: three species, three independent C, H, O balances.
				species: [
					{ id: 'glucose', formula: 'C6H12O6' },
					{ id: 'CO2', formula: 'CO2' },
					{ id: 'H2O', formula: 'H2O' }
				],
				elements: ['C', 'H', 'O'],
				specifications: [{ kind: 'rate', species: 'glucose', mol: -1 }]
			})
		);
		expect(e.field).toBe('species');
	});
});
