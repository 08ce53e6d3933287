import { describe, expect, it } from 'vitest';
import {
	ATOMIC_WEIGHTS,
	balanceAerobicGrowth,
	computeMaximumBiomassYield,
	computeSoleSourceYield,
	formulaMolarMass,
	solveAerobicGrowth
} from '../../chemistry';
import { errorOf } from './input-error';

/*
 * Shuler & Kargi, Bioprocess Engineering, 2nd ed. (2002), worked growth balance:
 *   C6H12O6 + 3 O2 + 0.48 NH3 → 0.48 C6H10NO3 + 4.32 H2O + 3.12 CO2
 *   Yx/s 0.384 g/g, Yx/O2 0.721 g/g, RQ 1.04.
 * The biomass C6H10NO3 is CH1.6667O0.5N0.1667 per C-mol.
 */
const GLUCOSE = 'C6H12O6';
const SK_BIOMASS = 'CH1.666667O0.5N0.166667';

describe('Yx/s from the element balance (Shuler & Kargi 2002 worked example)', () => {
	it('gives Yx/s 0.384 and Yx/O2 0.721 from the measured RQ 1.04', () => {
		const y = solveAerobicGrowth({
			substrateFormula: GLUCOSE,
			biomassFormula: SK_BIOMASS,
			measured: { kind: 'respiratoryQuotient', molCo2PerMolO2: 3.12 / 3 }
		});
		expect(y.biomassOnSubstrateGPerG).toBeCloseTo(0.384, 3);
		expect(y.biomassOnOxygenGPerG).toBeCloseTo(0.721, 3);
		expect(y.ammoniaPerSubstrateMol).toBeCloseTo(0.48, 3);
	});

	it('gives Yx/s 0.384 and RQ 1.04 from the measured Yx/O2', () => {
		// Yx/O2 = 0.48 × M(C6H10NO3) / (3 × M(O2)), from the same balance.
		const yxo = (0.48 * formulaMolarMass('C6H10NO3')) / (3 * formulaMolarMass('O2'));
		const y = solveAerobicGrowth({
			substrateFormula: GLUCOSE,
			biomassFormula: SK_BIOMASS,
			measured: { kind: 'oxygenYield', gBiomassPerGO2: yxo }
		});
		expect(y.biomassOnSubstrateGPerG).toBeCloseTo(0.384, 3);
		expect(y.respiratoryQuotient).toBeCloseTo(1.04, 2);
	});

	it('gives Yx/O2 0.721 and RQ 1.04 from Yx/s 0.384, the same balance read the other way', () => {
		const yxs = (0.48 * formulaMolarMass('C6H10NO3')) / formulaMolarMass(GLUCOSE);
		const y = balanceAerobicGrowth({
			substrateFormula: GLUCOSE,
			biomassFormula: SK_BIOMASS,
			measured: { kind: 'substrateYield', gBiomassPerGSubstrate: yxs }
		});
		expect(y.biomassOnOxygenGPerG).toBeCloseTo(0.721, 3);
		expect(y.respiratoryQuotient).toBeCloseTo(1.04, 2);
	});

	it('never exceeds the electron limit Yx/s ≤ γs/γx, however high the RQ (degree-of-reduction balance, Roels 1983)', () => {
		// γ glucose 4 per C-mol; γ biomass CH1.6667O0.5N0.1667 = 4 + 1.6667 − 1 − 0.5 = 4.1667 (NH3 reference)
		const limitCmol = 4 / (4 + 1.666667 - 2 * 0.5 - 3 * 0.166667);
		const limitG = (limitCmol * formulaMolarMass(SK_BIOMASS)) / (formulaMolarMass(GLUCOSE) / 6);
		const y = solveAerobicGrowth({
			substrateFormula: GLUCOSE,
			biomassFormula: SK_BIOMASS,
			measured: { kind: 'respiratoryQuotient', molCo2PerMolO2: 50 }
		});
		expect(y.biomassOnSubstrateGPerG).toBeLessThan(limitG);
		expect(y.biomassOnSubstrateGPerG).toBeGreaterThan(0.99 * limitG);
	});

	it('shows how weak a handle RQ is on glucose: Yx/s moves many per cent per per cent of RQ', () => {
		// Carbon and electron balances per mol glucose (degree of reduction, Roels 1983): x C-mol biomass,
		// c mol CO2, o mol O2: 6 = x + c and 24 = γx·x + 4·o with γx = 4 + 1.6667 − 1 − 0.5 = 4.1667.
		// With RQ = c/o: x = 6(1 − RQ)/(1 − (γx/4)·RQ), so d ln x / d ln RQ = RQ·[−1/(1 − RQ) + (γx/4)/(1 − (γx/4)·RQ)];
		// at RQ 1.04 that is 1.04 × (25 − 12.5) = 13.0: a 1 % error in RQ moves Yx/s by 13 %.
		const at = (rq: number) =>
			solveAerobicGrowth({
				substrateFormula: GLUCOSE,
				biomassFormula: SK_BIOMASS,
				measured: { kind: 'respiratoryQuotient', molCo2PerMolO2: rq }
			});
		const g = (4 + 1.666667 - 1 - 0.5) / 4;
		const analytic = 1.04 * (-1 / (1 - 1.04) + g / (1 - g * 1.04));
		expect(at(1.04).yieldElasticity / analytic).toBeCloseTo(1, 2);
		expect(errorOf(() => at(1.0)).message).toMatch(/no aerobic growth|almost no growth/);
		expect(errorOf(() => at(1.0004)).message).toMatch(/almost no growth/);
	});

	it('counts ash as dry weight that carries no carbon', () => {
		// With ash fraction a, each C-mol of organic biomass weighs M/(1 − a): Yx/s scales by 1/(1 − a).
		const dry = solveAerobicGrowth({
			substrateFormula: GLUCOSE,
			biomassFormula: SK_BIOMASS,
			measured: { kind: 'respiratoryQuotient', molCo2PerMolO2: 1.04 }
		});
		const ashy = solveAerobicGrowth({
			substrateFormula: GLUCOSE,
			biomassFormula: SK_BIOMASS,
			ashFraction: 0.1,
			measured: { kind: 'respiratoryQuotient', molCo2PerMolO2: 1.04 }
		});
		expect(ashy.biomassOnSubstrateGPerG / dry.biomassOnSubstrateGPerG).toBeCloseTo(1 / 0.9, 6);
	});

	it('refuses a measurement that leaves no growth', () => {
		expect(
			errorOf(() =>
				solveAerobicGrowth({
					substrateFormula: GLUCOSE,
					biomassFormula: SK_BIOMASS,
					measured: { kind: 'respiratoryQuotient', molCo2PerMolO2: 0 }
				})
			).field
		).toBe('measured.molCo2PerMolO2');
		// Below the RQ of growth at the electron limit, O2 would have to be produced.
		const low = errorOf(() =>
			solveAerobicGrowth({
				substrateFormula: GLUCOSE,
				biomassFormula: SK_BIOMASS,
				measured: { kind: 'respiratoryQuotient', molCo2PerMolO2: 0.5 }
			})
		);
		expect(low.message).toMatch(/cannot have an RQ of 0.5/);
		expect(low.field).toBe('measured');
	});
});

describe('the yield of a sole source of one element', () => {
	it('gives the Shuler & Kargi ammonia yield: 0.48 C6H10NO3 per 0.48 NH3', () => {
		const expected = formulaMolarMass('C6H10NO3') / formulaMolarMass('NH3'); // 8.46 g/g, same balance
		expect(
			computeSoleSourceYield({ substrateFormula: 'NH3', element: 'N', biomassFormula: SK_BIOMASS })
		).toBeCloseTo(expected, 4);
	});

	it('reads the biomass fraction when given: (NH4)2SO4 against 14 % N (Neidhardt et al. 1990)', () => {
		const nInSulfate = (2 * ATOMIC_WEIGHTS.N) / formulaMolarMass('(NH4)2SO4'); // 0.2120 g/g
		expect(
			computeSoleSourceYield({
				substrateFormula: '(NH4)2SO4',
				element: 'N',
				biomassElementFraction: 0.14
			})
		).toBeCloseTo(nInSulfate / 0.14, 9);
	});

	it('says why a substrate without the element cannot be its source', () => {
		expect(() =>
			computeSoleSourceYield({
				substrateFormula: GLUCOSE,
				element: 'N',
				biomassElementFraction: 0.14
			})
		).toThrow(/contains no N/);
		expect(() =>
			computeSoleSourceYield({
				substrateFormula: 'KH2PO4',
				element: 'P',
				biomassFormula: 'CH1.8O0.5N0.2'
			})
		).toThrow(/has no P/);
		expect(
			errorOf(() =>
				computeSoleSourceYield({
					substrateFormula: 'NH3',
					element: 'Xx',
					biomassElementFraction: 0.1
				})
			).field
		).toBe('element');
	});
});

describe('the most biomass the element balances allow (Yx/s bound, degree-of-reduction balance)', () => {
	// Hand calculation with IUPAC 2021 abridged standard atomic weights, C 12.011, H 1.008,
	// O 15.999, N 14.007, and the usual biomass CH1.8O0.5N0.2 (γx = 4 + 1.8 − 1 − 0.6 = 4.2):
	// M(biomass) per C-mol = 12.011 + 1.8 × 1.008 + 0.5 × 15.999 + 0.2 × 14.007 = 24.6263 g.
	const BIOMASS = 'CH1.8O0.5N0.2';
	const biomassGPerCmol = 12.011 + 1.8 * 1.008 + 0.5 * 15.999 + 0.2 * 14.007;

	it('glucose: the electrons bind first, γs/γx = 4/4.2 C-mol/C-mol, 0.781 g/g', () => {
		const glucoseGPerCmol = (6 * 12.011 + 12 * 1.008 + 6 * 15.999) / 6;
		const bound = computeMaximumBiomassYield({
			substrateFormula: GLUCOSE,
			biomassFormula: BIOMASS
		})!;
		expect(bound.limitedBy).toBe('electrons');
		expect(bound.maxCmolPerCmol).toBeCloseTo(4 / 4.2, 9);
		expect(bound.maxGPerG).toBeCloseTo(((4 / 4.2) * biomassGPerCmol) / glucoseGPerCmol, 9);
		expect(bound.maxGPerG).toBeCloseTo(0.781, 3);
		expect(bound.reason).toMatch(/γs\/γx = 4\/4\.2/);
	});

	it('ethanol (γs 6): the carbon binds first, 1 C-mol/C-mol, 1.07 g/g', () => {
		const ethanolGPerCmol = (2 * 12.011 + 6 * 1.008 + 15.999) / 2;
		const bound = computeMaximumBiomassYield({
			substrateFormula: 'C2H6O',
			biomassFormula: BIOMASS
		})!;
		expect(bound.limitedBy).toBe('carbon');
		expect(bound.maxGPerG).toBeCloseTo(biomassGPerCmol / ethanolGPerCmol, 9);
		expect(bound.maxGPerG).toBeCloseTo(1.069, 3);
	});

	it('ash adds mass to each C-mol of dry biomass: 8 % ash raises the bound by 1/0.92', () => {
		const plain = computeMaximumBiomassYield({
			substrateFormula: GLUCOSE,
			biomassFormula: BIOMASS
		})!;
		const withAsh = computeMaximumBiomassYield({
			substrateFormula: GLUCOSE,
			biomassFormula: BIOMASS,
			ashFraction: 0.08
		})!;
		expect(withAsh.maxGPerG).toBeCloseTo(plain.maxGPerG / 0.92, 9);
	});

	it('gives no bound for a substrate without carbon or without electrons to give', () => {
		expect(computeMaximumBiomassYield({ substrateFormula: 'NH4Cl', biomassFormula: BIOMASS })).toBe(
			null
		);
		expect(computeMaximumBiomassYield({ substrateFormula: 'CO2', biomassFormula: BIOMASS })).toBe(
			null
		);
	});
});
