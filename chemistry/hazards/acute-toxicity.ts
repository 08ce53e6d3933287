/**
 * Acute toxicity of a mixture by the additivity formula, UN GHS Rev. 10, 3.1.3.6.1:
 * 100 / ATEmix = Σ Ci / ATEi, Ci in % w/w; the category from the ATE bands of table 3.1.1; an
 * ingredient known only by its category enters with the converted acute toxicity point estimate
 * of table 3.1.2.
 *
 * Simplifications:
 * - Every ingredient with an acute toxicity statement is counted, also below 1 %. The standard
 *   lets ingredients below 1 % be left out unless there is reason to suspect they still matter
 *   (3.1.3.3); a very toxic trace is exactly that case, so we keep them all (the conservative
 *   reading). An ingredient without such a statement is taken as not acutely toxic, as water or
 *   sugar (3.1.3.6.2.1), never as of unknown toxicity (3.1.3.6.2.3).
 * - H300, H310 and H330 cover categories 1 and 2; without the ingredient's own estimate we use
 *   category 2's point estimate.
 * - One inhalation form for the whole solution (default dusts and mists: what a solution gives
 *   off is a mist); the standard reads each ingredient in its own form.
 * - Since ATEmix is never below the smallest ATEi, a solution is never put in a more severe
 *   category than its most toxic ingredient's on that route. This only matters where table
 *   3.1.2's estimate sits on a band's edge: dusts and mists category 3 is 0.5 mg/L, the upper
 *   limit of category 2, so a category 3 dust would otherwise come out as category 2.
 * - Category 5 (optional) is given only when an ingredient itself carries the route's category 5
 *   statement; inhalation category 5 has no numeric band and is left to the per-ingredient rule
 *   in mixture-rules.ts.
 */
import { GHS, atMost, namesOf, type Finding, type RuleIngredient } from './rule-types';

export type InhalationForm = 'gas' | 'vapour' | 'dust-mist';
type Route = 'oral' | 'dermal' | 'inhalation';
type Scale = 'oral' | 'dermal' | InhalationForm;

/** Table 3.1.2: converted acute toxicity point estimates for categories 1–4 (5: oral and dermal). */
const POINT_ESTIMATES: Readonly<Record<Scale, readonly number[]>> = {
	oral: [0.5, 5, 100, 500, 2500],
	dermal: [5, 50, 300, 1100, 2500],
	gas: [10, 100, 700, 4500],
	vapour: [0.05, 0.5, 3, 11],
	'dust-mist': [0.005, 0.05, 0.5, 1.5]
};

/** Table 3.1.1: the upper ATE limit of categories 1–4 (5: oral and dermal). */
const CATEGORY_UPPER_LIMITS: Readonly<Record<Scale, readonly number[]>> = {
	oral: [5, 50, 300, 2000, 5000],
	dermal: [50, 200, 1000, 2000, 5000],
	gas: [100, 500, 2500, 20000],
	vapour: [0.5, 2, 10, 20],
	'dust-mist': [0.05, 0.5, 1, 5]
};

/** The statement of categories 1–5 on each route (Annex 3). */
const STATEMENTS: Readonly<Record<Route, readonly string[]>> = {
	oral: ['H300', 'H300', 'H301', 'H302', 'H303'],
	dermal: ['H310', 'H310', 'H311', 'H312', 'H313'],
	inhalation: ['H330', 'H330', 'H331', 'H332', 'H333']
};

/** The category read from each statement; H300/H310/H330 as category 2 (see above). */
const CATEGORY_OF_STATEMENT: Readonly<Record<Route, readonly [string, number][]>> = {
	oral: [
		['H300', 2],
		['H301', 3],
		['H302', 4],
		['H303', 5]
	],
	dermal: [
		['H310', 2],
		['H311', 3],
		['H312', 4],
		['H313', 5]
	],
	inhalation: [
		['H330', 2],
		['H331', 3],
		['H332', 4]
	]
};

export const ACUTE_TOXICITY_CODES: ReadonlySet<string> = new Set(Object.values(STATEMENTS).flat());

export interface AcuteToxicityResult {
	oralMgPerKg: number | null;
	dermalMgPerKg: number | null;
	/** In `inhalationUnit`. */
	inhalation: number | null;
	inhalationUnit: 'ppmV' | 'mg/L';
	findings: Finding[];
}

const BASIS = `${GHS}, 3.1.3.6.1 (additivity formula), tables 3.1.1 and 3.1.2`;

function ownEstimate(ingredient: RuleIngredient, route: Route): number | undefined {
	const own = ingredient.acuteToxicityEstimates;
	if (route === 'oral') return own?.oralMgPerKg;
	if (route === 'dermal') return own?.dermalMgPerKg;
	return own?.inhalation;
}

interface Estimate {
	ate: number;
	/** Its own category on the route (5 past the last band: not classified). */
	category: number;
}

/** The ingredient's estimate on a route: its own value, else its most severe statement's. */
function estimateOf(ingredient: RuleIngredient, route: Route, scale: Scale): Estimate | undefined {
	const own = ownEstimate(ingredient, route);
	if (own !== undefined) return { ate: own, category: categoryOf(own, scale, true) ?? 6 };
	const category = CATEGORY_OF_STATEMENT[route].find(([code]) => ingredient.codes.has(code))?.[1];
	if (category === undefined) return undefined;
	return { ate: POINT_ESTIMATES[scale][category - 1], category };
}

function categoryOf(ateMix: number, scale: Scale, withCategory5: boolean): number | null {
	const limits = CATEGORY_UPPER_LIMITS[scale];
	const usable = withCategory5 ? limits.length : Math.min(limits.length, 4);
	for (let i = 0; i < usable; i++) if (atMost(ateMix, limits[i])) return i + 1;
	return null;
}

function classifyRoute(ingredients: readonly RuleIngredient[], route: Route, scale: Scale) {
	const terms = ingredients.flatMap((ingredient) => {
		const estimate = estimateOf(ingredient, route, scale);
		return estimate === undefined || ingredient.percent === 0 ? [] : [{ ingredient, ...estimate }];
	});
	const sum = terms.reduce((s, t) => s + t.ingredient.percent / t.ate, 0);
	if (sum === 0) return { ateMix: null, finding: null };
	const ateMix = 100 / sum;
	const category5InUse = ingredients.some((i) => i.codes.has(STATEMENTS[route][4]));
	const banded = categoryOf(ateMix, scale, category5InUse && route !== 'inhalation');
	if (banded === null) return { ateMix, finding: null };
	const category = Math.max(banded, Math.min(...terms.map((t) => t.category)));
	if (category > STATEMENTS[route].length) return { ateMix, finding: null };
	const finding: Finding = {
		code: STATEMENTS[route][category - 1],
		ingredients: namesOf(terms.map((t) => t.ingredient)),
		basis: BASIS
	};
	return { ateMix, finding };
}

export function classifyAcuteToxicity(
	ingredients: readonly RuleIngredient[],
	inhalationForm: InhalationForm
): AcuteToxicityResult {
	const oral = classifyRoute(ingredients, 'oral', 'oral');
	const dermal = classifyRoute(ingredients, 'dermal', 'dermal');
	const inhalation = classifyRoute(ingredients, 'inhalation', inhalationForm);
	return {
		oralMgPerKg: oral.ateMix,
		dermalMgPerKg: dermal.ateMix,
		inhalation: inhalation.ateMix,
		inhalationUnit: inhalationForm === 'gas' ? 'ppmV' : 'mg/L',
		findings: [oral.finding, dermal.finding, inhalation.finding].filter((f) => f !== null)
	};
}
