import { describe, expect, it } from 'vitest';
import type { ComponentSpec } from '../../chemistry/components';
import { computeComposition, PRECIPITATION_RULES } from '../../chemistry/composition';
import {
	designFeeds,
	type FeedDesignInput,
	type FeedDesignResult
} from '../../chemistry/feed-design';
import reference from './reference/feed-design-lp.json';
import { errorOf } from './input-error';

// IUPAC 2021 standard atomic weights, conventional values (Prohaska et al., Pure Appl. Chem. 94:573, 2022).
const W = {
	H: 1.008,
	C: 12.011,
	N: 14.007,
	O: 15.999,
	Na: 22.98976928,
	Mg: 24.305,
	P: 30.973761998,
	S: 32.06,
	Cl: 35.45,
	K: 39.0983,
	Ca: 40.078
};
// Osmotic coefficients at physiological concentration, 37 °C (chemistry/REFERENCES.md, Osmolality, "C"):
// NaCl 0.93, KCl 0.92, KH2PO4 0.87, CaCl2 0.86, MgSO4 0.58, Na2SO4 0.74, glucose 1.01. Salts without a
// value of their own borrow one of the same charge type, as the component library does.
const PHI = { KCl: 0.92, KH2PO4: 0.87, CaCl2: 0.86, MgSO4: 0.58, Na2SO4: 0.74, glucose: 1.01 };

function ion(label: string, charge: number, count = 1) {
	return { ion: label, charge, count };
}
function spec(
	id: string,
	formula: string,
	ions: ReturnType<typeof ion>[],
	phi: number,
	solubilityGPerL: number
): ComponentSpec {
	return {
		id,
		name: id,
		formula,
		ions,
		osmoticCoefficient: phi,
		solubility: { points: [{ temperatureC: 25, gPerL: solubilityGPerL }], source: 'test value' }
	};
}

// Solubilities at 25 °C as the component library holds them (CRC Handbook / Merck Index, from memory).
const glucose = spec('d-glucose', 'C6H12O6', [], PHI.glucose, 909);
const calciumChloride = spec(
	'calcium-chloride',
	'CaCl2',
	[ion('Ca^2+', 2), ion('Cl-', -1, 2)],
	PHI.CaCl2,
	813
);
const sodiumPhosphate = spec(
	'sodium-dihydrogen-phosphate',
	'NaH2PO4',
	[ion('Na+', 1), ion('H2PO4-', -1)],
	PHI.KH2PO4,
	950
);
const ammoniumChloride = spec(
	'ammonium-chloride',
	'NH4Cl',
	[ion('NH4+', 1), ion('Cl-', -1)],
	PHI.KCl,
	395
);
const ammoniumSulfate = spec(
	'ammonium-sulfate',
	'(NH4)2SO4',
	[ion('NH4+', 1, 2), ion('SO4^2-', -2)],
	PHI.Na2SO4,
	764
);
const potassiumChloride = spec(
	'potassium-chloride',
	'KCl',
	[ion('K+', 1), ion('Cl-', -1)],
	PHI.KCl,
	355
);
const potassiumSulfate = spec(
	'potassium-sulfate',
	'K2SO4',
	[ion('K+', 1, 2), ion('SO4^2-', -2)],
	PHI.Na2SO4,
	120
);

const M = {
	glucose: 6 * W.C + 12 * W.H + 6 * W.O,
	CaCl2: W.Ca + 2 * W.Cl,
	NaH2PO4: W.Na + 2 * W.H + W.P + 4 * W.O,
	MgHPO4: W.Mg + W.H + W.P + 4 * W.O
};

function input(partial: Partial<FeedDesignInput>): FeedDesignInput {
	return {
		candidates: [],
		needs: [],
		initialVolumeL: 10,
		feedVolumeL: 1,
		maxFeedVolumeL: 5,
		temperatureC: 25,
		osmolalityMaxMOsmPerKg: 3000,
		dissolvedSolidsMaxGPerL: 700,
		...partial
	};
}

function need(key: string, requiredGPerLFinal: number, presentG = 0) {
	return { key, name: key, requiredGPerLFinal, presentG };
}

function linesOf(result: FeedDesignResult, key: string) {
	const feed = result.feeds.find((f) => f.key === key);
	if (!feed) throw new Error(`no feed ${key}`);
	return Object.fromEntries(feed.lines.map((l) => [l.componentId, l]));
}

describe('one feed, worked by hand', () => {
	// 10 L culture + 1 L feed = 11 L final. Glucose: 30 g/L × 11 L = 330 g. N: 2.4 g/L × 11 L − 4 g in the basal = 22.4 g,
	// all from NH4Cl at 14.007 / 53.489 g N per g: 85.54 g. Both in the 1 L feed.
	const result = designFeeds(
		input({
			candidates: [{ component: glucose }, { component: ammoniumChloride }],
			needs: [need('d-glucose', 30), need('N', 2.4, 4)],
			osmolalityMaxMOsmPerKg: 5000
		})
	);
	const nh4clM = W.N + 4 * W.H + W.Cl;
	const nh4clGPerL = (22.4 * nh4clM) / W.N;

	it('puts each nutrient in at the mass its only carrier needs, rounded up to 4 figures', () => {
		expect(nh4clGPerL).toBeCloseTo(85.54, 2);
		expect(result.feasible).toBe(true);
		expect(result.split).toBeNull();
		expect(result.feeds).toHaveLength(1);
		const lines = linesOf(result, 'single');
		expect(lines['d-glucose'].gPerL).toBe(330);
		expect(lines['ammonium-chloride'].gPerL).toBeGreaterThanOrEqual(nh4clGPerL);
		expect(lines['ammonium-chloride'].gPerL / nh4clGPerL - 1).toBeLessThan(1e-3);
		for (const c of result.coverage) expect(c.providedG).toBeGreaterThanOrEqual(c.neededG);
	});

	it("reports the recipe analysis's osmolality and dissolved solids for the feed", () => {
		// Σ c·ν·φ: 330/180.156 × 1000 × 1 × 1.01 + 85.54/53.489 × 1000 × 2 × 0.92 = 1850.0 + 2942.6 = 4792.6 mOsm/kg.
		const hand =
			(330 / M.glucose) * 1000 * PHI.glucose + (nh4clGPerL / nh4clM) * 1000 * 2 * PHI.KCl;
		expect(hand).toBeCloseTo(4792.6, 0);
		const feed = result.feeds[0];
		expect(feed.osmolalityMOsmPerKg).toBeGreaterThanOrEqual(hand * (1 - 1e-9));
		expect(feed.osmolalityMOsmPerKg / hand - 1).toBeLessThan(1e-3);
		// Dissolved solids: 330 g/L glucose + the NH4Cl line.
		expect(feed.dissolvedSolidsGPerL).toBeCloseTo(
			330 + linesOf(result, 'single')['ammonium-chloride'].gPerL,
			9
		);
		const check = computeComposition({
			lines: feed.lines.map((l) => ({
				component: l.componentId === 'd-glucose' ? glucose : ammoniumChloride,
				amount: l.gPerL,
				unit: 'g/L'
			}))
		});
		expect(feed.osmolalityMOsmPerKg).toBe(check.osmolality.estimateMOsmPerKg);
		expect(feed.warnings).toEqual([]);
	});

	it('refuses the same feed under a 3000 mOsm/kg limit in one litre', () => {
		const tight = designFeeds(
			input({
				candidates: [{ component: glucose }, { component: ammoniumChloride }],
				needs: [need('d-glucose', 30), need('N', 2.4, 4)]
			})
		);
		expect(tight.feasible).toBe(false);
		expect(tight.problems[0]).toContain('osmolality limit of 3000 mOsm/kg');
	});
});

describe('the least-mass mix under an osmolality limit, against an independent LP solver', () => {
	// tests/chemistry/reference/feed-design-lp.py (scipy.optimize.linprog, HiGHS) solves the same program; its output is
	// tests/chemistry/reference/feed-design-lp.json. The osmolality limit binds, so cheap NH4Cl gives way to (NH4)2SO4.
	const result = designFeeds(
		input({
			candidates: [
				ammoniumChloride,
				ammoniumSulfate,
				potassiumChloride,
				potassiumSulfate,
				glucose
			].map((component) => ({ component })),
			needs: [need('d-glucose', 40), need('N', 3, 3), need('K', 2, 2), need('S', 0.5, 0.5)],
			feedVolumeL: 2,
			osmolalityMaxMOsmPerKg: 3600
		})
	);

	it('reaches the same least total mass with a mix from the same family of optima', () => {
		expect(result.feasible).toBe(true);
		expect(result.split).toBeNull();
		const lines = linesOf(result, 'single');
		for (const [id, [lowG, highG]] of Object.entries(reference.massRangeG)) {
			const ours = lines[id]?.massG ?? 0;
			// Lines are rounded up to 4 significant figures: never below, at most 0.1 % above.
			expect(ours).toBeGreaterThanOrEqual(lowG * (1 - 1e-6));
			expect(ours).toBeLessThanOrEqual(highG * (1 + 1e-3) + 1e-9);
		}
		const total = Object.values(lines).reduce((s, l) => s + l.massG, 0);
		expect(total).toBeGreaterThanOrEqual(reference.totalMassG * (1 - 1e-6));
		expect(total / reference.totalMassG - 1).toBeLessThan(1e-3);
		// The limit binds (0.2 % below it, the designer's margin for rounding).
		expect(result.feeds[0].osmolalityMOsmPerKg).toBeLessThanOrEqual(3600);
		expect(result.feeds[0].osmolalityMOsmPerKg).toBeGreaterThanOrEqual(
			reference.bindingOsmolalityMOsmPerKg * (1 - 1e-6)
		);
		for (const c of result.coverage) expect(c.providedG).toBeGreaterThanOrEqual(c.neededG);
	});
});

describe('a precipitation pair splits the proposal', () => {
	// Needs in 10 L + 1 L: Ca 0.2 g/L × 11 = 2.2 g → CaCl2 2.2 × 110.978 / 40.078 = 6.092 g; P 0.5 × 11 = 5.5 g →
	// NaH2PO4 5.5 × 119.976 / 30.974 = 21.30 g; glucose 30 × 11 = 330 g. In one litre: Ca 54.9 mM with phosphate
	// 177.6 mM, which the recipe analysis flags as calcium phosphate (from 1 mM each).
	const design = input({
		candidates: [
			{ component: glucose },
			{ component: calciumChloride },
			{ component: sodiumPhosphate }
		],
		needs: [need('d-glucose', 30), need('Ca', 0.2), need('P', 0.5)]
	});
	const result = designFeeds(design);
	const cacl2G = (2.2 * M.CaCl2) / W.Ca;
	const phosphateG = (5.5 * M.NaH2PO4) / W.P;
	// Osmoles by hand (Σ g/M × ν × φ, mOsm): A = CaCl2 × 3 × 0.86; B = NaH2PO4 × 2 × 0.87 + glucose × 1.01.
	const osmolesA = (cacl2G / M.CaCl2) * 1000 * 3 * PHI.CaCl2;
	const osmolesB =
		(phosphateG / M.NaH2PO4) * 1000 * 2 * PHI.KH2PO4 + (330 / M.glucose) * 1000 * PHI.glucose;

	it('says which pair forbids one feed, with the analysis’s own rule', () => {
		expect(result.split?.precipitates).toEqual(['calcium phosphate']);
		const rule = PRECIPITATION_RULES.find((r) => r.product === 'calcium phosphate')!;
		expect(result.split?.warnings[0]).toContain(
			`flagged from ${rule.cationMinMM} mM Ca and ${rule.anionMinMM} mM phosphate`
		);
	});

	it('puts calcium in feed A and phosphate with the glucose in feed B', () => {
		expect(result.feasible).toBe(true);
		expect(result.feeds.map((f) => f.key)).toEqual(['cations', 'anions']);
		expect(Object.keys(linesOf(result, 'cations'))).toEqual(['calcium-chloride']);
		expect(Object.keys(linesOf(result, 'anions')).sort()).toEqual([
			'd-glucose',
			'sodium-dihydrogen-phosphate'
		]);
		expect(linesOf(result, 'cations')['calcium-chloride'].massG / cacl2G - 1).toBeLessThan(1e-3);
		expect(
			linesOf(result, 'anions')['sodium-dihydrogen-phosphate'].massG / phosphateG - 1
		).toBeLessThan(1e-3);
	});

	it('shares the volume so both feeds sit equally far below their tightest limit, together the volume asked for', () => {
		// Osmolality binds in both (A: 141.6 of 3000; B: 2159 of 3000, ahead of solids 351 of 700 and glucose's
		// solubility), so each gets volume in proportion to its osmoles and both reach (A + B) / 1 L.
		const [a, b] = result.feeds;
		expect(a.volumeL + b.volumeL).toBeCloseTo(1, 12);
		expect(a.volumeL).toBeCloseTo(osmolesA / (osmolesA + osmolesB), 6);
		expect(osmolesA + osmolesB).toBeCloseTo(2300.9, 0);
		for (const feed of result.feeds)
			expect(feed.osmolalityMOsmPerKg / (osmolesA + osmolesB) - 1).toBeLessThan(1e-3);
	});

	it('gives feeds the recipe analysis passes: no warning, within both limits', () => {
		for (const feed of result.feeds) {
			const specs = {
				'd-glucose': glucose,
				'calcium-chloride': calciumChloride,
				'sodium-dihydrogen-phosphate': sodiumPhosphate
			} as Record<string, ComponentSpec>;
			const analysis = computeComposition({
				lines: feed.lines.map((l) => ({
					component: specs[l.componentId],
					amount: l.gPerL,
					unit: 'g/L'
				})),
				temperatureC: 25
			});
			expect(analysis.warnings).toEqual([]);
			expect(analysis.osmolality.estimateMOsmPerKg).toBeLessThanOrEqual(
				design.osmolalityMaxMOsmPerKg
			);
			expect(analysis.dissolvedSolidsGPerL).toBeLessThanOrEqual(design.dissolvedSolidsMaxGPerL);
		}
	});

	it('says which pair forbids one feed when the two feeds cannot fit the volume', () => {
		// Test salts that dissolve only to 10 g/L. Each nutrient needs 8 g of its salt at 1 L of feed (8 (10 + V) / 11 g at V L):
		// one litre holds both (8 g/L each), but apart each feed needs 8 / (10 × 0.998) = 0.80 L, 1.60 L in all.
		const calciumSalt = spec(
			'calcium-salt',
			'CaCl2',
			[ion('Ca^2+', 2), ion('Cl-', -1, 2)],
			PHI.CaCl2,
			10
		);
		const phosphateSalt = spec(
			'phosphate-salt',
			'NaH2PO4',
			[ion('Na+', 1), ion('H2PO4-', -1)],
			PHI.KH2PO4,
			10
		);
		const tight = designFeeds(
			input({
				candidates: [{ component: calciumSalt }, { component: phosphateSalt }],
				needs: [need('Ca', ((8 / 11) * W.Ca) / M.CaCl2), need('P', ((8 / 11) * W.P) / M.NaH2PO4)]
			})
		);
		expect(tight.feasible).toBe(false);
		expect(tight.split?.precipitates).toEqual(['calcium phosphate']);
		expect(tight.problems[0]).toBe(
			'One feed is ruled out: the recipe analysis flags calcium phosphate in it (common practice: these are kept apart). Split in two, the feeds cannot meet every demand within the limits:'
		);
		// Two feeds of V_A = V_B = 8 (10 + V) / 11 / 9.98 L: V = 16 (10 + V) / 109.78 → V = 160 / 93.78 = 1.7061 L.
		const leastL = 160 / (11 * 10 * 0.998 - 16);
		expect(leastL).toBeCloseTo(1.7061, 4);
		expect(tight.minimumFeedVolumeL).toBeCloseTo(leastL, 6);
		expect(tight.problems.at(-1)).toContain('two feeds of at least 1.71 L in all would work');
	});

	it('cannot split a component that brings both partners itself, and says so', () => {
		// MgHPO4 (a test component): Mg 0.5 g/L × 11 L = 5.5 g → 27.2 g in 1 L, 226 mM of Mg and of phosphate,
		// flagged as magnesium phosphate (from 1 mM Mg with 10 mM phosphate) in any feed that holds it.
		const mgHpo4 = spec(
			'magnesium-hydrogen-phosphate',
			'MgHPO4',
			[ion('Mg^2+', 2), ion('HPO4^2-', -2)],
			PHI.MgSO4,
			100
		);
		expect((5.5 * M.MgHPO4) / W.Mg).toBeCloseTo(27.22, 2);
		const stuck = designFeeds(
			input({ candidates: [{ component: mgHpo4 }], needs: [need('Mg', 0.5)] })
		);
		expect(stuck.feasible).toBe(false);
		expect(stuck.split?.precipitates).toEqual(['magnesium phosphate']);
		expect(stuck.problems[0]).toMatch(
			/magnesium-hydrogen-phosphate brings both Mg and phosphate itself, so no split keeps that pair apart/
		);
	});
});

describe('limits that cannot be met', () => {
	// Glucose only, 10 L + V L, 30 g/L × (10 + V) g in V L, each g/L counting 1000 × 1.01 / 180.156 = 5.606 mOsm/kg.
	const o = (1000 * PHI.glucose) / M.glucose;
	const glucoseOnly = (partial: Partial<FeedDesignInput>) =>
		designFeeds(
			input({
				candidates: [{ component: glucose }],
				needs: [need('d-glucose', 30)],
				osmolalityMaxMOsmPerKg: 1500,
				...partial
			})
		);

	it('names the limit, how far off it is, and the least volume that works', () => {
		const result = glucoseOnly({ feedVolumeL: 1 });
		expect(result.feasible).toBe(false);
		// At 1 L: 330 g/L × 5.606 = 1850 mOsm/kg.
		expect(330 * o).toBeCloseTo(1850.0, 0);
		expect(result.problems[0]).toContain('osmolality limit of 1500 mOsm/kg');
		expect(result.problems[0]).toContain('at least 1850 mOsm/kg');
		// 30 (10 + V) o ≤ 1500 × 0.998 V (the designer keeps 0.2 % below each limit) → V ≥ 300 o / (1497 − 30 o) = 1.2657 L.
		const leastL = (300 * o) / (1500 * 0.998 - 30 * o);
		expect(leastL).toBeCloseTo(1.2657, 4);
		expect(result.minimumFeedVolumeL).toBeCloseTo(leastL, 6);
		expect(result.problems[1]).toContain('at least 1.27 L');
		expect(glucoseOnly({ feedVolumeL: 1.27 }).feasible).toBe(true);
	});

	it('says when no volume would do, because each litre of feed dilutes the culture by more than it brings', () => {
		// 30 g/L needed per litre of final volume is 168 mOsm/kg of glucose per litre of feed: above a 150 limit at any volume.
		const result = glucoseOnly({ osmolalityMaxMOsmPerKg: 150 });
		expect(30 * o).toBeGreaterThan(150);
		expect(result.minimumFeedVolumeL).toBeNull();
		expect(result.problems.at(-1)).toMatch(/No feed volume is enough/);
	});

	it('names a nutrient no chosen component carries', () => {
		const result = designFeeds(
			input({
				candidates: [{ component: glucose }],
				needs: [need('d-glucose', 30), need('Ca', 0.2)]
			})
		);
		expect(result.problems).toEqual([
			'No chosen component provides Ca; the feed needs 2.2 g of it in all. Add a component that carries it.'
		]);
	});

	it('proposes nothing when the basal medium already covers every need', () => {
		const result = designFeeds(
			input({ candidates: [{ component: glucose }], needs: [need('d-glucose', 30, 400)] })
		);
		expect(result.feasible).toBe(true);
		expect(result.feeds).toEqual([]);
		expect(result.notes.join(' ')).toMatch(/no feed is needed/);
	});
});

describe('bad input names its field', () => {
	const base = { candidates: [{ component: glucose }], needs: [need('d-glucose', 30)] };
	it.each([
		['no feed volume', { feedVolumeL: 0 }, 'feedVolumeL'],
		['more feed than room in the vessel', { feedVolumeL: 6 }, 'feedVolumeL'],
		['no candidate', { candidates: [] }, 'candidates'],
		[
			'a candidate twice',
			{ candidates: [{ component: glucose }, { component: glucose }] },
			'candidates.1'
		],
		['a negative osmolality limit', { osmolalityMaxMOsmPerKg: -1 }, 'osmolalityMaxMOsmPerKg'],
		[
			'a solids limit that is not a number',
			{ dissolvedSolidsMaxGPerL: Number.NaN },
			'dissolvedSolidsMaxGPerL'
		],
		['a temperature beyond water', { temperatureC: 400 }, 'temperatureC']
	] as [string, Partial<FeedDesignInput>, string][])(
		'%s names its field',
		(_what, partial, field) => {
			expect(errorOf(() => designFeeds(input({ ...base, ...partial }))).field).toBe(field);
		}
	);
});
