/**
 * Health hazards of a mixture from its ingredients' classification: the generic concentration
 * limits of UN GHS Rev. 10, chapters 3.2–3.10 (section and table beside each rule).
 *
 * Simplifications, each also in the report of the work:
 * - No specific concentration limits: an ingredient's own limits (set by a supplier or an
 *   authority, e.g. for strong bases) are not known here; the generic ones apply.
 * - Skin and eye: the summation of tables 3.2.3 and 3.3.3 over ingredients present at ≥ 1 %
 *   (3.2.3.3.1, 3.3.3.3.1). The standard warns that acids, bases and some salts can corrode at
 *   lower concentrations and that pH is the better guide for them; `pH` in the options applies
 *   the extreme-pH criterion (pH ≤ 2 or ≥ 11.5 → skin and eye category 1).
 * - Optional categories (skin 3, eye 2B, aspiration 2, acute toxicity 5) are given only when an
 *   ingredient itself carries that optional category: a sign the supplier's jurisdiction uses it.
 * - Sensitisers use 1 % for the statement (the column of table 3.4.5 most jurisdictions use;
 *   the table also offers 0.1 % for sub-category 1A and by choice); 0.1–1 % gives a notice.
 * - STOT: the 10 % column of the cut-off tables; a category 1 ingredient at 1–10 % gives
 *   category 2. STOT category 3 (H335, H336) by adding up ingredients, 20 % as the standard's
 *   generic value (3.8.3.4.5), which it asks to be used with expert judgement.
 * - Aspiration: the kinematic viscosity (≤ 20.5 mm²/s at 40 °C) is not checked.
 * - Inhalation category 5 (H333) has no numeric band: an ingredient with H333 at ≥ 1 % passes it on.
 */
import {
	GHS,
	atLeast,
	carrying,
	finding,
	percentOf,
	relevantAt,
	type Finding,
	type RuleIngredient
} from './rule-types';

const RELEVANT_PERCENT = 1;

export function skinFindings(ingredients: readonly RuleIngredient[]): Finding[] {
	const relevant = relevantAt(ingredients, RELEVANT_PERCENT);
	const cat1 = carrying(relevant, 'H314');
	const cat2 = carrying(relevant, 'H315').filter((i) => !cat1.includes(i));
	const cat3 = carrying(relevant, 'H316').filter((i) => !cat1.includes(i) && !cat2.includes(i));
	const [s1, s2, s3] = [percentOf(cat1), percentOf(cat2), percentOf(cat3)];
	const basis = `${GHS}, 3.2.3.3, table 3.2.3`;
	if (atLeast(s1, 5)) return [finding('H314', cat1, basis)];
	if (cat1.length > 0 || atLeast(10 * s1 + s2, 10)) {
		return [finding('H315', [...cat1, ...cat2], basis)];
	}
	const category3InUse = carrying(ingredients, 'H316').length > 0;
	if (category3InUse && (atLeast(10 * s1 + s2, 1) || atLeast(10 * s1 + s2 + s3, 10))) {
		return [finding('H316', [...cat1, ...cat2, ...cat3], basis)];
	}
	return [];
}

export function eyeFindings(ingredients: readonly RuleIngredient[]): Finding[] {
	const relevant = relevantAt(ingredients, RELEVANT_PERCENT);
	// An ingredient both skin category 1 and eye category 1 counts once (table 3.3.3, note).
	const serious = carrying(relevant, 'H314', 'H318');
	const irritant = carrying(relevant, 'H319', 'H320').filter((i) => !serious.includes(i));
	const [s1, s2] = [percentOf(serious), percentOf(irritant)];
	const basis = `${GHS}, 3.3.3.3, table 3.3.3`;
	if (atLeast(s1, 3)) return [finding('H318', serious, basis)];
	if (serious.length > 0 || atLeast(10 * s1 + s2, 10)) {
		const onlyMild = serious.length === 0 && carrying(irritant, 'H319').length === 0;
		return [finding(onlyMild ? 'H320' : 'H319', [...serious, ...irritant], basis)];
	}
	return [];
}

/** pH ≤ 2 or ≥ 11.5 → skin and eye category 1 (the extreme-pH criterion of 3.2 and 3.3). */
export function extremePhFindings(ingredients: readonly RuleIngredient[], pH: number): Finding[] {
	if (pH > 2 && pH < 11.5) return [];
	const acidsAndBases = carrying(ingredients, 'H314', 'H290', 'H318');
	const basis = `${GHS}, chapters 3.2 and 3.3: pH ${pH} (≤ 2 or ≥ 11.5) indicates corrosion`;
	return [finding('H314', acidsAndBases, basis), finding('H318', acidsAndBases, basis)];
}

export interface SensitiserNoticeFinding {
	code: 'H317' | 'H334';
	ingredients: string[];
	basis: string;
}

export function sensitiserFindings(ingredients: readonly RuleIngredient[]) {
	const findings: Finding[] = [];
	const notices: SensitiserNoticeFinding[] = [];
	const basis = `${GHS}, 3.4.3.3, table 3.4.5`;
	for (const code of ['H317', 'H334'] as const) {
		const carriers = carrying(ingredients, code);
		const classified = relevantAt(carriers, 1);
		const traces = relevantAt(carriers, 0.1).filter((i) => !classified.includes(i));
		if (classified.length > 0) findings.push(finding(code, classified, basis));
		if (traces.length > 0) {
			const names = finding(code, traces, basis).ingredients;
			notices.push({ code, ingredients: names, basis: `${basis}; 3.4.3.3.2 (0.1–1 %)` });
		}
	}
	return { findings, notices };
}

interface IngredientLimit {
	/** The ingredient's statement … */
	code: string;
	/** … gives the mixture this one at or above `percent`. */
	gives: string;
	percent: number;
	basis: string;
}

const INGREDIENT_LIMITS: readonly IngredientLimit[] = [
	{ code: 'H340', gives: 'H340', percent: 0.1, basis: `${GHS}, 3.5.3.3, table 3.5.1` },
	{ code: 'H341', gives: 'H341', percent: 1, basis: `${GHS}, 3.5.3.3, table 3.5.1` },
	{ code: 'H350', gives: 'H350', percent: 0.1, basis: `${GHS}, 3.6.3.3, table 3.6.1` },
	{ code: 'H350i', gives: 'H350i', percent: 0.1, basis: `${GHS}, 3.6.3.3, table 3.6.1` },
	{ code: 'H351', gives: 'H351', percent: 1, basis: `${GHS}, 3.6.3.3, table 3.6.1 (1 %)` },
	{ code: 'H370', gives: 'H370', percent: 10, basis: `${GHS}, 3.8.3.4 (category 1 ≥ 10 %)` },
	{ code: 'H370', gives: 'H371', percent: 1, basis: `${GHS}, 3.8.3.4 (category 1 at 1–10 %)` },
	{ code: 'H371', gives: 'H371', percent: 10, basis: `${GHS}, 3.8.3.4 (category 2 ≥ 10 %)` },
	{ code: 'H372', gives: 'H372', percent: 10, basis: `${GHS}, 3.9.3.4 (category 1 ≥ 10 %)` },
	{ code: 'H372', gives: 'H373', percent: 1, basis: `${GHS}, 3.9.3.4 (category 1 at 1–10 %)` },
	{ code: 'H373', gives: 'H373', percent: 10, basis: `${GHS}, 3.9.3.4 (category 2 ≥ 10 %)` },
	{
		code: 'H333',
		gives: 'H333',
		percent: 1,
		basis: `${GHS}, 3.1 (no band for category 5 by inhalation; passed on from 1 %)`
	},
	{ code: 'H420', gives: 'H420', percent: 0.1, basis: `${GHS}, 4.2.3 (category 1 ≥ 0.1 %)` }
];

export const INGREDIENT_LIMIT_CODES: ReadonlySet<string> = new Set(
	INGREDIENT_LIMITS.map((limit) => limit.code)
);

/** Classes judged one ingredient at a time: mutagens, carcinogens, STOT 1 and 2, ozone. */
export function ingredientLimitFindings(ingredients: readonly RuleIngredient[]): Finding[] {
	const findings: Finding[] = [];
	for (const ingredient of ingredients) {
		for (const code of ingredient.codes) {
			// The first limit met, in the table's order, is the most severe for that statement.
			const met = INGREDIENT_LIMITS.find(
				(limit) => limit.code === code && atLeast(ingredient.percent, limit.percent)
			);
			if (met) findings.push(finding(met.gives, [ingredient], met.basis));
		}
	}
	return findings;
}

export function additiveSingleExposureFindings(ingredients: readonly RuleIngredient[]): Finding[] {
	const basis = `${GHS}, 3.8.3.4.5 (category 3 ingredients adding up to ≥ 20 %)`;
	return (['H335', 'H336'] as const).flatMap((code) => {
		const carriers = relevantAt(carrying(ingredients, code), RELEVANT_PERCENT);
		return atLeast(percentOf(carriers), 20) ? [finding(code, carriers, basis)] : [];
	});
}

export function aspirationFindings(ingredients: readonly RuleIngredient[]): Finding[] {
	const relevant = relevantAt(ingredients, RELEVANT_PERCENT);
	const basis = `${GHS}, 3.10.3.3 (ingredients adding up to ≥ 10 %; viscosity not checked)`;
	const cat1 = carrying(relevant, 'H304');
	if (atLeast(percentOf(cat1), 10)) return [finding('H304', cat1, basis)];
	const either = carrying(relevant, 'H304', 'H305');
	const category2InUse = carrying(ingredients, 'H305').length > 0;
	if (category2InUse && atLeast(percentOf(either), 10)) return [finding('H305', either, basis)];
	return [];
}
