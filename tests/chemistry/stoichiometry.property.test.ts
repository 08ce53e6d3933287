import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseFormula } from '../../chemistry/formula';
import {
	solveStoichiometry,
	type StoichiometryResult,
	type StoichiometrySpecies,
	type StoichiometrySpecification
} from '../../chemistry/stoichiometry';

// Independent of the library: atoms per unit (biomass per C-mol) and γ with C +4, H +1, O −2, N −3.
const VALENCE: Record<string, number> = { C: 4, H: 1, O: -2, N: -3 };

function atomsPerUnit(s: StoichiometrySpecies): Record<string, number> {
	const elements = parseFormula(s.formula).elements;
	if (s.ashFraction === undefined && s.role !== 'biomass') return elements;
	return Object.fromEntries(Object.entries(elements).map(([k, n]) => [k, n / elements.C]));
}

function expectClosed(species: StoichiometrySpecies[], r: StoichiometryResult): void {
	for (const el of ['C', 'H', 'O', 'N']) {
		let sum = 0;
		let magnitude = 0;
		for (const s of species) {
			const term = (atomsPerUnit(s)[el] ?? 0) * r.rates[s.id].mol;
			sum += term;
			magnitude += Math.abs(term);
		}
		expect(Math.abs(sum)).toBeLessThanOrEqual(1e-9 * magnitude);
	}
	let electrons = 0;
	let magnitude = 0;
	for (const s of species) {
		const gamma = Object.entries(atomsPerUnit(s)).reduce(
			(acc, [el, n]) => acc + (VALENCE[el] ?? 0) * n,
			0
		);
		electrons += gamma * r.rates[s.id].mol;
		magnitude += Math.abs(gamma * r.rates[s.id].mol);
	}
	expect(Math.abs(electrons)).toBeLessThanOrEqual(1e-9 * magnitude);
	expect(r.electronBalance.closes).toBe(true);
}

// Substrates with formula, carbon count and γ per C-mol (chemistry/REFERENCES.md values, derived).
const SUBSTRATES = [
	{ formula: 'C6H12O6', carbon: 6, gamma: 4 },
	{ formula: 'C3H8O3', carbon: 3, gamma: 14 / 3 },
	{ formula: 'CH4O', carbon: 1, gamma: 6 },
	{ formula: 'C2H6O', carbon: 2, gamma: 6 },
	{ formula: 'C2H4O2', carbon: 2, gamma: 4 },
	{ formula: 'C3H6O3', carbon: 3, gamma: 4 }
];

const round = (x: number, digits = 4) => Number(x.toFixed(digits));

const WEIGHTS: Record<string, number> = { C: 12.011, H: 1.008, O: 15.999, N: 14.007 }; // IUPAC 2021

function gramsPerUnit(formula: string): number {
	return Object.entries(parseFormula(formula).elements).reduce(
		(acc, [el, n]) => acc + WEIGHTS[el] * n,
		0
	);
}

// A plausible biomass CH_aO_bN_c (a 1.5–2.0, b 0.3–0.7, c 0.12–0.28) with 0–12 % ash, and a yield set
// to a fraction of the most the substrate's carbon and electrons allow, so O2 stays consumed and CO2
// produced: Yx/s (C-mol/C-mol) ≤ min(1, γs/γx).
const caseArb = fc.record({
	substrate: fc.constantFrom(...SUBSTRATES),
	h: fc.double({ min: 1.5, max: 2.0, noNaN: true }),
	o: fc.double({ min: 0.3, max: 0.7, noNaN: true }),
	n: fc.double({ min: 0.12, max: 0.28, noNaN: true }),
	ash: fc.double({ min: 0, max: 0.12, noNaN: true }),
	fractionOfMax: fc.double({ min: 0.1, max: 0.9, noNaN: true }),
	substrateMol: fc.double({ min: 0.01, max: 100, noNaN: true }),
	yieldAs: fc.constantFrom('massYield', 'molarRatio', 'oxygenRate')
});

type Case = typeof caseArb extends fc.Arbitrary<infer T> ? T : never;

function buildCase(c: Case): {
	species: StoichiometrySpecies[];
	specifications: StoichiometrySpecification[];
	ycmol: number;
} {
	const biomassFormula = `CH${round(c.h)}O${round(c.o)}N${round(c.n)}`;
	const gammaX = 4 + round(c.h) - 2 * round(c.o) - 3 * round(c.n);
	const ycmol = c.fractionOfMax * Math.min(1, c.substrate.gamma / gammaX);
	const species: StoichiometrySpecies[] = [
		{ id: 's', formula: c.substrate.formula, role: 'substrate' },
		{ id: 'o2', formula: 'O2' },
		{ id: 'nh3', formula: 'NH3' },
		{ id: 'x', formula: biomassFormula, ashFraction: round(c.ash) },
		{ id: 'co2', formula: 'CO2' },
		{ id: 'h2o', formula: 'H2O' }
	];
	const rate: StoichiometrySpecification = { kind: 'rate', species: 's', mol: -c.substrateMol };
	let second: StoichiometrySpecification;
	if (c.yieldAs === 'massYield') {
		// g per C-mol from IUPAC 2021 weights; biomass dry weight includes ash.
		const gPerCmolX = gramsPerUnit(biomassFormula) / (1 - round(c.ash));
		const gPerCmolS = gramsPerUnit(c.substrate.formula) / c.substrate.carbon;
		second = {
			kind: 'massYield',
			product: 'x',
			substrate: 's',
			gPerG: (ycmol * gPerCmolX) / gPerCmolS
		};
	} else if (c.yieldAs === 'molarRatio') {
		// C-mol biomass per mol substrate.
		second = {
			kind: 'molarRatio',
			numerator: 'x',
			denominator: 's',
			value: ycmol * c.substrate.carbon
		};
	} else {
		// O2 from the electron balance: 4·|r_O2| = γs·C-mol_s − γx·C-mol_x.
		const cmolS = c.substrateMol * c.substrate.carbon;
		second = {
			kind: 'rate',
			species: 'o2',
			mol: -(c.substrate.gamma * cmolS - gammaX * ycmol * cmolS) / 4
		};
	}
	return { species, specifications: [rate, second], ycmol };
}

describe('stoichiometry properties (fast-check)', () => {
	it('closes every element balance and the electron balance for random well-posed growth', () => {
		fc.assert(
			fc.property(caseArb, (c) => {
				const { species, specifications, ycmol } = buildCase(c);
				const r = solveStoichiometry({ species, specifications });
				expectClosed(species, r);
				expect(r.degreesOfFreedom).toBe(2);
				expect(r.redundancy).toBe(0);
				expect(r.rates.s.mol).toBeCloseTo(-c.substrateMol, 9);
				expect(r.yields.biomassOnSubstrateCmolPerCmol ?? NaN).toBeCloseTo(ycmol, 9);
				expect(r.rates.o2.mol).toBeLessThan(0);
				expect(r.rates.co2.mol).toBeGreaterThan(0);
			}),
			{ numRuns: 300 }
		);
	});

	it('scales every rate with the substrate rate', () => {
		fc.assert(
			fc.property(caseArb, fc.double({ min: 0.1, max: 10, noNaN: true }), (c, k) => {
				const base = buildCase({ ...c, yieldAs: 'massYield' });
				const scaled = buildCase({ ...c, yieldAs: 'massYield', substrateMol: c.substrateMol * k });
				const a = solveStoichiometry(base);
				const b = solveStoichiometry(scaled);
				for (const s of base.species) {
					expect(b.rates[s.id].mol).toBeCloseTo(a.rates[s.id].mol * k, 6);
				}
			}),
			{ numRuns: 100 }
		);
	});

	it('finds a redundant but exact RQ consistent and keeps the balance closed', () => {
		fc.assert(
			fc.property(caseArb, (c) => {
				const built = buildCase(c);
				const first = solveStoichiometry(built);
				const rq = first.yields.respiratoryQuotient ?? NaN;
				const withRq = solveStoichiometry({
					species: built.species,
					specifications: [
						...built.specifications,
						{ kind: 'molarRatio', numerator: 'co2', denominator: 'o2', value: rq }
					]
				});
				expect(withRq.redundancy).toBe(1);
				expect(withRq.consistency?.consistent).toBe(true);
				expect(withRq.consistency?.chiSquare ?? Infinity).toBeLessThan(1e-10);
				expectClosed(built.species, withRq);
				expect(withRq.rates.x.mol).toBeCloseTo(first.rates.x.mol, 6);
			}),
			{ numRuns: 100 }
		);
	});
});
