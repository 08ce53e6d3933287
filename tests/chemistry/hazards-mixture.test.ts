import { describe, expect, it } from 'vitest';
import {
	ChemistryInputError,
	classifySolution,
	type ClassifySolutionOptions,
	type SolutionIngredient
} from '../../chemistry';
import { REFERENCE_COMPONENT_DATA } from '../../chemistry/data/components';

const h = (...codes: string[]) => codes.map((code) => ({ code, text: `text of ${code}` }));

function codesOf(ingredients: SolutionIngredient[], options?: ClassifySolutionOptions): string[] {
	return classifySolution(ingredients, options).hazards.map((hazard) => hazard.code);
}

const one = (massFraction: number, ...codes: string[]) =>
	codesOf([{ name: 'X', massFraction, hazards: h(...codes) }]);

describe('sodium hydroxide (H290, H314) diluted', () => {
	const naoh = (massFraction: number, options?: ClassifySolutionOptions) =>
		codesOf([{ name: 'Sodium hydroxide', massFraction, hazards: h('H290', 'H314') }], options);

	it('is corrosive at 50 %', () => {
		// Table 3.2.3 (UN GHS Rev. 10, 3.2.3.3): skin cat 1 at 50 % ≥ 5 % → skin cat 1, H314.
		// Table 3.3.3: skin cat 1 + eye cat 1 = 50 % ≥ 3 % → eye cat 1 (H318), which may be
		// omitted beside H314 (1.4.10.5.3.3). H290: 50 % ≥ 1 % (common practice).
		expect(naoh(0.5)).toEqual(['H290', 'H314']);
	});

	it('irritates skin and eyes at 2 %', () => {
		// Table 3.2.3: skin cat 1 at 1 % ≤ 2 % < 5 % → skin cat 2, H315.
		// Table 3.3.3: skin cat 1 + eye cat 1 at 1 % ≤ 2 % < 3 % → eye cat 2A, H319.
		expect(naoh(0.02)).toEqual(['H290', 'H315', 'H319']);
	});

	it('damages eyes but only irritates skin at 3 %', () => {
		// Table 3.3.3: 3 % ≥ 3 % → eye cat 1 (H318); table 3.2.3: 3 % < 5 % → skin cat 2 (H315).
		expect(naoh(0.03)).toEqual(['H290', 'H315', 'H318']);
	});

	it('is corrosive from exactly 5 % and not below', () => {
		// Table 3.2.3: the limit is ≥ 5 %; 7 % checks that 0.07 × 100 = 7.000000000000001 still counts.
		expect(naoh(0.05)).toContain('H314');
		expect(naoh(0.07)).toContain('H314');
		expect(naoh(0.0499)).not.toContain('H314');
	});

	it('carries nothing at 0.5 %', () => {
		// Below the 1 % cut-off of relevant ingredients (3.2.3.3.1, 3.3.3.3.1); H290 kept only
		// from 1 % (common practice).
		expect(naoh(0.005)).toEqual([]);
	});

	it('is corrosive by its pH when the pH is given', () => {
		// Extreme pH (≤ 2 or ≥ 11.5) indicates skin corrosion, chapter 3.2 (EU CLP Annex I
		// 3.2.3.1.2 writes it for mixtures); 0.5 mol/L NaOH has pH ≈ 13.7.
		expect(naoh(0.02, { pH: 13.7 })).toEqual(['H290', 'H314']);
		expect(naoh(0.02, { pH: 11 })).toEqual(['H290', 'H315', 'H319']);
	});
});

describe('acute toxicity by the additivity formula (3.1.3.6.1)', () => {
	// 100 / ATEmix = Σ Ci / ATEi (Ci in %); an H300 ingredient enters with category 2's converted
	// point estimate, 5 mg/kg (table 3.1.2); bands of table 3.1.1 (oral: cat 1 ≤ 5, 2 ≤ 50,
	// 3 ≤ 300, 4 ≤ 2000 mg/kg).
	const selenite = (massFraction: number) =>
		classifySolution([{ name: 'Sodium selenite', massFraction, hazards: h('H300') }]);

	it('leaves 0.1 % of an oral category 2 ingredient unclassified', () => {
		// 0.1 / 5 = 0.02 → ATEmix = 100 / 0.02 = 5000 mg/kg > 2000 → not classified.
		const result = selenite(0.001);
		expect(result.acuteToxicityEstimates.oralMgPerKg).toBeCloseTo(5000, 6);
		expect(result.hazards).toEqual([]);
	});

	it('makes 1 % harmful if swallowed', () => {
		// 1 / 5 = 0.2 → ATEmix = 500 mg/kg; 300 < 500 ≤ 2000 → cat 4, H302.
		const result = selenite(0.01);
		expect(result.acuteToxicityEstimates.oralMgPerKg).toBeCloseTo(500, 6);
		expect(result.hazards.map((x) => x.code)).toEqual(['H302']);
		expect(result.hazards[0].ingredients).toEqual(['Sodium selenite']);
	});

	it('makes 5 % toxic and 10 % fatal if swallowed', () => {
		// 5 / 5 = 1 → 100 mg/kg: 50 < 100 ≤ 300 → cat 3 (H301).
		// 10 / 5 = 2 → 50 mg/kg: 5 < 50 ≤ 50 → cat 2 (H300).
		expect(selenite(0.05).hazards.map((x) => x.code)).toEqual(['H301']);
		expect(selenite(0.1).hazards.map((x) => x.code)).toEqual(['H300']);
	});

	it('adds the ingredients up', () => {
		// H301 (100 mg/kg) at 20 % and H302 (500 mg/kg) at 30 %: 20/100 + 30/500 = 0.26 →
		// ATEmix = 384.6 mg/kg: 300 < 384.6 ≤ 2000 → cat 4 (H302), from both.
		const result = classifySolution([
			{ name: 'A', massFraction: 0.2, hazards: h('H301') },
			{ name: 'B', massFraction: 0.3, hazards: h('H302') }
		]);
		expect(result.acuteToxicityEstimates.oralMgPerKg).toBeCloseTo(100 / 0.26, 6);
		expect(result.hazards.map((x) => [x.code, x.ingredients])).toEqual([['H302', ['A', 'B']]]);
	});

	it("uses an ingredient's own estimate when given", () => {
		// LD50 7 mg/kg at 1 %: 1/7 → ATEmix = 700 mg/kg → cat 4. With category 2's 5 mg/kg at
		// 0.5 %: 0.5/5 = 0.1 → 1000 mg/kg; with 1 mg/kg of its own: 0.5/1 → 200 → cat 3.
		const own = (oralMgPerKg: number, massFraction: number) =>
			classifySolution([
				{ name: 'Y', massFraction, hazards: h('H300'), acuteToxicityEstimates: { oralMgPerKg } }
			]);
		expect(own(7, 0.01).acuteToxicityEstimates.oralMgPerKg).toBeCloseTo(700, 6);
		expect(own(1, 0.005).hazards.map((x) => x.code)).toEqual(['H301']);
	});

	it('classifies the dermal and inhalation routes on their own bands', () => {
		// Dermal H311 (300 mg/kg): 50 % → 600 mg/kg (200 < 600 ≤ 1000, cat 3, H311);
		// 20 % → 1500 mg/kg (1000 < 1500 ≤ 2000, cat 4, H312).
		expect(one(0.5, 'H311')).toEqual(['H311']);
		expect(one(0.2, 'H311')).toEqual(['H312']);
		// Inhalation, dusts and mists, H332 (1.5 mg/L): 50 % → 3 mg/L (1 < 3 ≤ 5, H332);
		// 25 % → 6 mg/L > 5 → not classified. As vapour (11 mg/L): 50 % → 22 > 20 → not.
		expect(one(0.5, 'H332')).toEqual(['H332']);
		expect(one(0.25, 'H332')).toEqual([]);
		const vapour = { inhalationForm: 'vapour' } as const;
		expect(codesOf([{ name: 'V', massFraction: 1, hazards: h('H332') }], vapour)).toEqual(['H332']);
		expect(codesOf([{ name: 'V', massFraction: 0.5, hazards: h('H332') }], vapour)).toEqual([]);
	});

	it('never makes a solution more toxic than its most toxic ingredient', () => {
		// Table 3.1.2 gives dusts/mists cat 3 the estimate 0.5 mg/L, the upper limit of cat 2
		// in table 3.1.1; a pure cat 3 dust must stay cat 3 (H331), not become H330.
		expect(one(1, 'H331')).toEqual(['H331']);
	});

	it('uses category 5 only when an ingredient carries it', () => {
		// H303 (2500 mg/kg, table 3.1.2) at 50 % with H300 (5 mg/kg) at 0.1 %:
		// 50/2500 + 0.1/5 = 0.04 → ATEmix = 2500 mg/kg: 2000 < 2500 ≤ 5000 → cat 5 (H303).
		const result = classifySolution([
			{ name: 'Mild', massFraction: 0.5, hazards: h('H303') },
			{ name: 'Selenite', massFraction: 0.001, hazards: h('H300') }
		]);
		expect(result.acuteToxicityEstimates.oralMgPerKg).toBeCloseTo(2500, 6);
		expect(result.hazards.map((x) => x.code)).toEqual(['H303']);
	});
});

describe('per-ingredient limits', () => {
	it('sensitisers: the statement from 1 %, a notice from 0.1 % (table 3.4.5)', () => {
		expect(one(0.01, 'H317')).toEqual(['H317']);
		const trace = classifySolution([
			{ name: 'Cobalt salt', massFraction: 0.005, hazards: h('H334') }
		]);
		expect(trace.hazards).toEqual([]);
		expect(trace.notices).toEqual([
			expect.objectContaining({
				code: 'H334',
				ingredients: ['Cobalt salt'],
				text: 'May cause a reaction in sensitised people'
			})
		]);
		expect(
			classifySolution([{ name: 'Z', massFraction: 0.0009, hazards: h('H317') }]).notices
		).toEqual([]);
	});

	it('mutagens and carcinogens: category 1 from 0.1 %, category 2 from 1 % (tables 3.5.1, 3.6.1)', () => {
		expect(one(0.001, 'H340')).toEqual(['H340']);
		expect(one(0.0009, 'H350i')).toEqual([]);
		expect(one(0.001, 'H350i')).toEqual(['H350i']);
		expect(one(0.01, 'H341')).toEqual(['H341']);
		expect(one(0.009, 'H351')).toEqual([]);
	});

	it('reproductive toxicity: category 1 from 0.3 %, category 2 from 3 %, per effect (table 3.7.1)', () => {
		// Boric acid H360FD: 0.3 % ≥ 0.3 % → H360FD; 0.29 % → nothing.
		expect(one(0.003, 'H360FD')).toEqual(['H360FD']);
		expect(one(0.0029, 'H360FD')).toEqual([]);
		// H360Fd: fertility cat 1 at 1 % ≥ 0.3 %, development cat 2 at 1 % < 3 % → H360F only.
		expect(one(0.01, 'H360Fd')).toEqual(['H360F']);
		expect(one(0.03, 'H360Fd')).toEqual(['H360Fd']);
		expect(one(0.029, 'H361d')).toEqual([]);
		// Fertility from one ingredient, development from another: H360FD.
		expect(
			codesOf([
				{ name: 'F', massFraction: 0.01, hazards: h('H360F') },
				{ name: 'D', massFraction: 0.01, hazards: h('H360D') }
			])
		).toEqual(['H360FD']);
	});

	it('STOT: category 1 from 10 %, category 2 at 1–10 % (3.8.3.4, 3.9.3.4)', () => {
		expect(one(0.1, 'H372')).toEqual(['H372']);
		expect(one(0.05, 'H372')).toEqual(['H373']);
		expect(one(0.005, 'H372')).toEqual([]);
		expect(one(0.1, 'H373')).toEqual(['H373']);
		expect(one(0.09, 'H373')).toEqual([]);
		expect(one(0.02, 'H370')).toEqual(['H371']);
	});

	it('STOT category 3 adds up to 20 % (3.8.3.4.5)', () => {
		const two = (x: number) => [
			{ name: 'P', massFraction: x, hazards: h('H335') },
			{ name: 'Q', massFraction: x, hazards: h('H335') }
		];
		// 12 % + 12 % = 24 % ≥ 20 %; 9 % + 9 % = 18 % < 20 %.
		expect(codesOf(two(0.12))).toEqual(['H335']);
		expect(codesOf(two(0.09))).toEqual([]);
	});
});

describe('aquatic hazards by summation (4.1.3.5.5, M-factor 1)', () => {
	it('steps down the chronic categories with dilution, flagged environmental', () => {
		// Chronic 1 at 25 % ≥ 25 % → H410. At 10 %: 10 < 25, but 10 × 10 = 100 ≥ 25 → Chronic 2.
		// At 2 %: 10 × 2 = 20 < 25; 100 × 2 = 200 ≥ 25 → Chronic 3. At 0.2 %: 100 × 0.2 = 20 < 25
		// and 0.2 < 25 (Chronic 4) → none.
		expect(one(0.25, 'H410')).toEqual(['H410']);
		expect(one(0.1, 'H410')).toEqual(['H411']);
		expect(one(0.02, 'H410')).toEqual(['H412']);
		expect(one(0.002, 'H410')).toEqual([]);
		const result = classifySolution([{ name: 'Cu', massFraction: 0.1, hazards: h('H410') }]);
		expect(result.hazards[0].environmental).toBe(true);
	});

	it('leaves H400 out beside H410 (1.4.10.5.3.3)', () => {
		expect(one(0.3, 'H400', 'H410')).toEqual(['H410']);
		// At 20 %: acute 20 < 25 → none; chronic 10 × 20 = 200 ≥ 25 → Chronic 2.
		expect(one(0.2, 'H400', 'H410')).toEqual(['H411']);
	});
});

describe('physical hazards', () => {
	it('drops H272 for aqueous solutions below 10 % (common practice)', () => {
		expect(one(0.05, 'H272')).toEqual([]);
		const kept = classifySolution([{ name: 'KNO3', massFraction: 0.1, hazards: h('H272') }]);
		expect(kept.hazards.map((x) => [x.code, x.commonPractice])).toEqual([['H272', true]]);
		const dry = { aqueous: false };
		expect(codesOf([{ name: 'KNO3', massFraction: 0.05, hazards: h('H272') }], dry)).toEqual([
			'H272'
		]);
	});

	it('carries over other physical statements and unknown codes', () => {
		const result = classifySolution([
			{ name: 'Ethanol', massFraction: 0.01, hazards: h('H225') },
			{ name: 'Sensitiser', massFraction: 0.01, hazards: [{ code: 'EUH208', text: 'Contains X' }] }
		]);
		expect(result.hazards.map((x) => [x.code, x.text, x.hazardClass])).toEqual([
			['H225', 'Highly flammable liquid and vapour', 'flammable-liquid'],
			['EUH208', 'Contains X', null]
		]);
	});

	it('splits combined statements', () => {
		expect(one(1, 'H300+H310+H330')).toEqual(['H300', 'H310', 'H330']);
	});
});

describe('a material as supplied', () => {
	it('gives back exactly its own statements for every reference component', () => {
		const withHazards = REFERENCE_COMPONENT_DATA.filter((c) => c.ghsHazards?.length);
		expect(withHazards.length).toBeGreaterThan(10);
		for (const component of withHazards) {
			const own = component.ghsHazards!.map((x) => x.code).sort();
			const got = codesOf([
				{ name: component.name, massFraction: 1, hazards: component.ghsHazards! }
			]);
			expect([component.id, got.sort()]).toEqual([component.id, own]);
		}
	});
});

describe('label and refusals', () => {
	it('gives the label elements after precedence', () => {
		// H301 + H315: skull and crossbones; no exclamation mark beside it (1.4.10.5.3.1 (a)).
		const result = classifySolution([{ name: 'T', massFraction: 1, hazards: h('H301', 'H315') }]);
		expect(result.label).toEqual({ pictograms: ['GHS06'], signalWord: 'Danger' });
	});

	it('names the field of a bad input', () => {
		const refuse = (ingredients: SolutionIngredient[], field: string) => {
			const error = (() => {
				try {
					classifySolution(ingredients);
				} catch (e) {
					return e;
				}
			})();
			expect(error).toBeInstanceOf(ChemistryInputError);
			expect((error as ChemistryInputError).field).toBe(field);
		};
		refuse([{ name: 'A', massFraction: 1.2, hazards: [] }], 'ingredients.0.massFraction');
		refuse([{ name: 'A', massFraction: Number.NaN, hazards: [] }], 'ingredients.0.massFraction');
		refuse([{ name: ' ', massFraction: 0.1, hazards: [] }], 'ingredients.0.name');
		refuse(
			[
				{ name: 'A', massFraction: 0.6, hazards: [] },
				{ name: 'B', massFraction: 0.6, hazards: [] }
			],
			'ingredients'
		);
		refuse(
			[{ name: 'A', massFraction: 0.1, hazards: [{ code: '', text: '' }] }],
			'ingredients.0.hazards.0.code'
		);
		expect(() => classifySolution([{ name: 'A', massFraction: 1.2, hazards: [] }])).toThrow(
			'Mass fraction of A must be from 0 to 1 g per g of solution (it is 1.2).'
		);
	});
});
