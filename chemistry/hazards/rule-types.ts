/** What the mixture rules share: an ingredient as the rules read it, and what a rule finds. */

export const GHS = 'UN GHS Rev. 10';

export interface RuleIngredient {
	name: string;
	/** g per 100 g of solution: the standard's concentration limits are in % w/w. */
	percent: number;
	/** Its statements, combined ones split (H300+H310 → H300, H310). */
	codes: ReadonlySet<string>;
	acuteToxicityEstimates?: AcuteToxicityEstimates;
}

/** An ingredient's own acute toxicity estimates (LD50/LC50 or ATE from its data sheet). */
export interface AcuteToxicityEstimates {
	oralMgPerKg?: number;
	dermalMgPerKg?: number;
	/** In the unit of the chosen inhalation form: ppmV for gases, mg/L for vapours and for dusts and mists. */
	inhalation?: number;
}

export interface Finding {
	code: string;
	ingredients: string[];
	/** The rule applied, with its section of the standard. */
	basis: string;
	/** A rule of the trade, not of the standard. */
	commonPractice?: boolean;
}

/**
 * `value ≥ limit`, forgiving the last bits of binary rounding (0.07 × 100 is 7.000000000000001,
 * 0.3 × 10 is 3.0000000000000004): a concentration exactly at a limit must meet it.
 */
export function atLeast(value: number, limit: number): boolean {
	return value >= limit - 1e-9 * Math.max(1, Math.abs(limit));
}

export function atMost(value: number, limit: number): boolean {
	return value <= limit + 1e-9 * Math.max(1, Math.abs(limit));
}

export function carrying(ingredients: readonly RuleIngredient[], ...codes: string[]) {
	return ingredients.filter((i) => codes.some((code) => i.codes.has(code)));
}

export function percentOf(ingredients: readonly RuleIngredient[]): number {
	return ingredients.reduce((sum, i) => sum + i.percent, 0);
}

export function namesOf(ingredients: readonly RuleIngredient[]): string[] {
	return [...new Set(ingredients.map((i) => i.name))];
}

export function finding(
	code: string,
	ingredients: readonly RuleIngredient[],
	basis: string,
	commonPractice = false
): Finding {
	return {
		code,
		ingredients: namesOf(ingredients),
		basis,
		...(commonPractice && { commonPractice })
	};
}

/** Present at or above a cut-off: the standard's "relevant ingredients" (e.g. ≥ 1 %, 3.2.3.3.1). */
export function relevantAt(ingredients: readonly RuleIngredient[], cutOffPercent: number) {
	return ingredients.filter((i) => atLeast(i.percent, cutOffPercent));
}
