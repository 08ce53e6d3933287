import { describe, expect, it } from 'vitest';
import { computeComposition } from '../../chemistry/composition';
import { findReferenceComponent } from '../../chemistry/components';
import { DEFAULT_ELEMENT_ROLES, defaultElementRole } from '../../chemistry/data/element-roles';
import { findBiomassComposition } from '../../chemistry/data/biomass';
import {
	FORMULA_FRACTION_TOLERANCE_G_PER_G,
	compareFractionsWithFormula
} from '../../chemistry/profile-elements';
import { assessSufficiency } from '../../chemistry/sufficiency';
import { errorOf } from './input-error';

/*
 * M9 minimal medium with glucose as printed in Sambrook & Russell, Molecular Cloning: A Laboratory
 * Manual, 3rd ed. (2001), appendix on media (its page from memory; the recipe agrees with the usual public
 * protocol pages that reproduce it):
 * 5× M9 salts per litre: 64 g Na2HPO4·7H2O, 15 g KH2PO4, 2.5 g NaCl, 5.0 g NH4Cl. One litre of medium:
 * 200 mL 5× salts, 2 mL 1 M MgSO4, 20 mL 20 % (w/v) glucose, 0.1 mL 1 M CaCl2, water to 1 L. So:
 *   Na2HPO4·7H2O 12.8 g/L, KH2PO4 3.0 g/L, NaCl 0.5 g/L, NH4Cl 1.0 g/L, MgSO4 2 mM, CaCl2 0.1 mM,
 *   glucose 4 g/L. No iron, no other trace element.
 *
 * The hand calculation uses IUPAC 2021 standard atomic weights (Prohaska et al., Pure Appl. Chem.
 * 94:573, 2022; conventional values for H, C, N, O, Mg, S, Cl), typed here rather than imported.
 */
const H = 1.008;
const N = 14.007;
const O = 15.999;
const Na = 22.98976928;
const Mg = 24.305;
const P = 30.973761998;
const S = 32.06;
const Cl = 35.45;
const K = 39.0983;
const Ca = 40.078;

const NA2HPO4_7H2O = 2 * Na + H + P + 4 * O + 7 * (2 * H + O); // 268.062 g/mol
const KH2PO4 = K + 2 * H + P + 4 * O; // 136.084 g/mol (chemistry/REFERENCES.md, derived)
const NACL = Na + Cl; // 58.440 g/mol (chemistry/REFERENCES.md, derived)
const NH4CL = N + 4 * H + Cl; // 53.489 g/mol

const molNa2HPO4 = 12.8 / NA2HPO4_7H2O; // 0.047750 mol/L
const molKH2PO4 = 3.0 / KH2PO4; // 0.022045 mol/L
const molNaCl = 0.5 / NACL; // 0.0085558 mol/L
const molNH4Cl = 1.0 / NH4CL; // 0.018695 mol/L
const molMgSO4 = 0.002;
const molCaCl2 = 0.0001;

/** Element supply of M9, g/L, worked out by hand from the recipe above. */
const M9_ELEMENTS_G_PER_L = {
	N: molNH4Cl * N, // 0.26187
	P: (molNa2HPO4 + molKH2PO4) * P, // 2.1618
	K: molKH2PO4 * K, // 0.86193
	Na: (2 * molNa2HPO4 + molNaCl) * Na, // 2.3922
	Cl: (molNH4Cl + molNaCl + 2 * molCaCl2) * Cl, // 0.97314
	Mg: molMgSO4 * Mg, // 0.04861
	S: molMgSO4 * S, // 0.06412
	Ca: molCaCl2 * Ca // 0.0040078
};

/*
 * Yx/s 0.5 g dry mass per g glucose: common practice for E. coli growing aerobically on glucose
 * (the round figure used for such estimates; no published source at hand, from memory).
 */
const YIELD_ON_GLUCOSE_G_PER_G = 0.5;

function assessM9(targetGPerL: number) {
	return assessSufficiency({
		profile: { kind: 'preset', id: 'bacterium-neidhardt-1990' },
		target: { biomassGPerL: targetGPerL },
		supply: {
			sources: [
				{ name: 'M9 glucose', elementsGPerL: M9_ELEMENTS_G_PER_L, componentsGPerL: { glucose: 4 } }
			]
		},
		safetyFactor: 1,
		carbon: {
			basis: 'component',
			component: 'glucose',
			yieldGPerG: YIELD_ON_GLUCOSE_G_PER_G,
			confidence: 'from memory',
			source: 'Common practice for E. coli on glucose'
		}
	});
}

describe('M9 glucose medium (Sambrook & Russell 2001) with the Neidhardt et al. (1990) bacterial composition', () => {
	it('is limited by nitrogen at about 1.87 g/L, glucose close behind at 2.00 g/L, as worked by hand', () => {
		// Maximum supportable biomass at safety factor 1 = supply / (demand per g biomass):
		//   glucose 4 g/L × Yx/s 0.5 = 2.00 g/L
		//   N  0.26187 / 0.14 (Neidhardt et al. 1990, confirmed) = 1.8705 g/L   ← the limit
		//   S  0.06412 / 0.01 = 6.41 g/L;  Mg 0.04861 / 0.005 = 9.72 g/L;  P 2.1618 / 0.03 = 72.1 g/L;  K 0.86193 / 0.01 = 86.2 g/L
		const handN = (molNH4Cl * N) / 0.14;
		expect(handN).toBeCloseTo(1.8705, 4);
		const r = assessM9(1.5);
		expect(r.limiting).toEqual({
			key: 'N',
			basis: 'element',
			ratio: expect.closeTo(handN / 1.5, 9)
		});
		expect(r.maximumSupportable.biomassGPerL).toBeCloseTo(handN, 9);
		expect(r.maximumSupportable.biomassGPerL).toBeCloseTo(1.87, 2);
		const max = (key: string) => r.lines.find((l) => l.key === key)?.maxBiomassGPerL;
		expect(max('glucose')).toBeCloseTo(4 * YIELD_ON_GLUCOSE_G_PER_G, 12);
		expect(max('S')).toBeCloseTo((0.002 * S) / 0.01, 9);
		expect(max('Mg')).toBeCloseTo((0.002 * Mg) / 0.005, 9);
		expect(max('P')).toBeCloseTo(((molNa2HPO4 + molKH2PO4) * P) / 0.03, 9);
		expect(max('K')).toBeCloseTo((molKH2PO4 * K) / 0.01, 9);
		// At 1.5 g/L every required nutrient suffices: the medium supports the target.
		expect(r.sufficient).toBe(true);
		// Above 1.87 g/L it does not, and N is what runs short.
		const high = assessM9(2);
		expect(high.sufficient).toBe(false);
		expect(
			high.lines.filter((l) => l.role === 'required' && !l.sufficient).map((l) => l.key)
		).toEqual(['N']);
	});

	it('warns of Fe (absent) and Ca (0.1 mM) by name instead of calling them limits', () => {
		const r = assessM9(1.5);
		const fe = r.lines.find((l) => l.key === 'Fe')!;
		const ca = r.lines.find((l) => l.key === 'Ca')!;
		expect(fe).toMatchObject({
			role: 'trace',
			supplyGPerL: 0,
			sufficient: false,
			confidence: 'from memory'
		});
		// Ca: 0.1 mM × 40.078 = 4.008 mg/L against 0.5 % of dry mass (from memory): 0.80 g/L at safety factor 1.
		expect(ca.maxBiomassGPerL).toBeCloseTo((molCaCl2 * Ca) / 0.005, 9);
		expect(ca).toMatchObject({ role: 'trace', sufficient: false });
		expect(r.limiting?.key).not.toBe('Fe');
		expect(r.maximumSupportable.biomassGPerL).toBeGreaterThan(1.8);
		expect(r.warnings).toHaveLength(2);
		expect(r.warnings[0]).toMatch(
			/^Ca covers 0\.534 × its demand \(the profile counts it at 0\.5 % of dry mass, from memory\), enough for about 0\.802 g\/L at safety factor 1: a trace element does not set the limit/
		);
		expect(r.warnings[1]).toMatch(
			/^Fe is in no source \(the profile counts it at 0\.2 % of dry mass, from memory\)/
		);
	});

	it('says for every value it used its role, its confidence and its source', () => {
		const r = assessM9(1.5);
		const neidhardt = findBiomassComposition('bacterium-neidhardt-1990')!;
		for (const line of r.lines) {
			if (line.key === 'glucose') {
				expect(line).toMatchObject({
					role: 'required',
					confidence: 'from memory',
					source: 'Common practice for E. coli on glucose'
				});
				continue;
			}
			// The preset's own grade for each value (chemistry/data/biomass.ts) and its citation.
			expect(line.confidence).toBe(neidhardt.massFractions[line.key].confidence);
			expect(line.source).toBe(neidhardt.source);
			expect(line.role).toBe(defaultElementRole(line.key));
			expect(line.roleFrom).toBe('default');
		}
		expect(r.lines.find((l) => l.key === 'N')?.confidence).toBe('confirmed');
		expect(r.lines.map((l) => l.key).sort()).toEqual([
			'Ca',
			'Cl',
			'Fe',
			'K',
			'Mg',
			'N',
			'Na',
			'P',
			'S',
			'glucose'
		]);
	});

	it('gets the same supply from the recipe analysis of the library components', () => {
		const line = (id: string, amount: number, unit: string) => ({
			component: findReferenceComponent(id)!,
			amount,
			unit
		});
		const m9 = computeComposition({
			lines: [
				line('disodium-hydrogen-phosphate-heptahydrate', 12.8, 'g/L'),
				line('potassium-dihydrogen-phosphate', 3.0, 'g/L'),
				line('sodium-chloride', 0.5, 'g/L'),
				line('ammonium-chloride', 1.0, 'g/L'),
				line('magnesium-sulfate', 2, 'mM'),
				line('calcium-chloride', 0.1, 'mM'),
				line('d-glucose', 4, 'g/L')
			]
		});
		for (const [symbol, gPerL] of Object.entries(M9_ELEMENTS_G_PER_L)) {
			expect(m9.elements.find((e) => e.symbol === symbol)!.gPerL / gPerL - 1).toBeCloseTo(0, 6);
		}
		expect(m9.elements.find((e) => e.symbol === 'Fe')?.gPerL ?? 0).toBe(0);
	});
});

describe('the table of default roles (common practice)', () => {
	it('makes C, N, P, S, K, Mg required and Fe, Ca, Zn, Cu, Mn, Co, Mo, Na, Cl trace; anything else trace', () => {
		for (const el of ['C', 'N', 'P', 'S', 'K', 'Mg'])
			expect(DEFAULT_ELEMENT_ROLES[el]).toBe('required');
		for (const el of ['Fe', 'Ca', 'Zn', 'Cu', 'Mn', 'Co', 'Mo', 'Na', 'Cl'])
			expect(DEFAULT_ELEMENT_ROLES[el]).toBe('trace');
		expect(defaultElementRole('Ge')).toBe('trace');
	});
});

describe('elemental fractions against the biomass formula', () => {
	// CH1.8O0.5N0.2 is 24.626 g per ash-free C-mol (Roels 1983; chemistry/REFERENCES.md, derived). With 8 % ash
	// its N is 0.2 × 14.007 / 24.626 × 0.92 = 0.10466 g/g, C 12.011 / 24.626 × 0.92 = 0.44871, O 0.5 × 15.999 /
	// 24.626 × 0.92 = 0.29885, H 1.8 × 1.008 / 24.626 × 0.92 = 0.06778.
	const neidhardtOrganic = { C: 0.5, H: 0.08, O: 0.2, N: 0.14, P: 0.03 };

	it('names both values when the Neidhardt fractions meet the standard formula with 8 % ash', () => {
		const mismatches = compareFractionsWithFormula({
			formula: 'CH1.8O0.5N0.2',
			ashFraction: 0.08,
			fractions: neidhardtOrganic
		});
		const n = mismatches.find((m) => m.element === 'N')!;
		expect(n.formulaFraction).toBeCloseTo(((0.2 * 14.007) / 24.626) * 0.92, 5);
		expect(n.message).toMatch(
			/^N is 14 % in the fractions but 10\.5 % by the formula CH1\.8O0\.5N0\.2 with 8 % ash/
		);
		// C 50 against 44.9, O 20 against 29.9, H 8 against 6.78: all beyond 1 percentage point; P is not in the formula.
		expect(mismatches.map((m) => m.element).sort()).toEqual(['C', 'H', 'N', 'O']);
		expect(mismatches.find((m) => m.element === 'O')!.message).toContain(
			'O is 20 % in the fractions but 29.9 % by the formula'
		);
	});

	it('passes fractions derived from the formula, and a formula derived from the fractions rounded to two decimals', () => {
		// Fractions of CH1.8O0.5N0.2 with 8 % ash, as worked above.
		expect(
			compareFractionsWithFormula({
				formula: 'CH1.8O0.5N0.2',
				ashFraction: 0.08,
				fractions: { C: 0.4487, H: 0.0678, O: 0.2989, N: 0.1047 }
			})
		).toEqual([]);
		// The other way: per C-mol, H = (0.08 / 1.008) / (0.5 / 12.011) = 1.907, O = (0.2 / 15.999) / (0.5 / 12.011) = 0.300,
		// N = (0.14 / 14.007) / (0.5 / 12.011) = 0.240; ash 1 − 0.92 = 0.08. Rounded, CH1.91O0.3N0.24 is within the tolerance.
		expect(
			compareFractionsWithFormula({
				formula: 'CH1.91O0.3N0.24',
				ashFraction: 0.08,
				fractions: neidhardtOrganic
			})
		).toEqual([]);
		expect(FORMULA_FRACTION_TOLERANCE_G_PER_G).toBe(0.01);
	});

	it('says so when no ash is entered, and reports the contradiction through the sufficiency assessment', () => {
		// Without ash the formula is the whole dry mass: N = 0.2 × 14.007 / 24.626 = 0.11376 → "11.4 %".
		const [n] = compareFractionsWithFormula({
			formula: 'CH1.8O0.5N0.2',
			ashFraction: null,
			fractions: { N: 0.14 }
		});
		expect(n.message).toMatch(
			/^N is 14 % in the fractions but 11\.4 % by the formula CH1\.8O0\.5N0\.2 with no ash entered/
		);
		const r = assessSufficiency({
			profile: {
				kind: 'elementalFractions',
				fractions: neidhardtOrganic,
				formula: 'CH1.8O0.5N0.2',
				ashFraction: 0.08
			},
			target: { biomassGPerL: 1 },
			supply: { sources: [{ elementsGPerL: { C: 5, N: 1, P: 1 } }] }
		});
		expect(
			r.warnings.some((w) =>
				w.startsWith(
					'N is 14 % in the fractions but 10.5 % by the formula CH1.8O0.5N0.2 with 8 % ash'
				)
			)
		).toBe(true);
		// The published yeast table derives its C, H, O, N from its own formula: no warning.
		const yeast = assessSufficiency({
			profile: { kind: 'preset', id: 'yeast-bionumbers-101801' },
			target: { biomassGPerL: 1 },
			supply: {
				sources: [{ elementsGPerL: { C: 5, N: 1, P: 1, K: 1, S: 1, Mg: 1, Ca: 1, Fe: 1, Zn: 1 } }]
			}
		});
		expect(yeast.warnings).toEqual([]);
	});

	it('refuses a formula it cannot read, naming the field', () => {
		const e = errorOf(() =>
			assessSufficiency({
				profile: { kind: 'elementalFractions', fractions: neidhardtOrganic, formula: 'CH1.8Xq0.5' },
				target: { biomassGPerL: 1 },
				supply: { sources: [{ elementsGPerL: { C: 5, N: 1, P: 1 } }] }
			})
		);
		expect(e.field).toBe('profile.formula');
		expect(e.message).toMatch(/^Biomass formula:/);
		expect(
			errorOf(() =>
				compareFractionsWithFormula({ formula: 'CH1.8O0.5N0.2', ashFraction: 1.2, fractions: {} })
			).field
		).toBe('ashFraction');
	});
});
