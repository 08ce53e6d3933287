/**
 * Reproductive toxicity of a mixture, UN GHS Rev. 10, 3.7.3.3 and table 3.7.1: an ingredient of
 * category 1 at ≥ 0.3 % makes the mixture category 1, one of category 2 at ≥ 3 % category 2, one
 * with effects on or via lactation at ≥ 0.3 % gives H362 (the table's 0.3 % / 3 % column; it also
 * offers 0.1 % for every category, which some jurisdictions use).
 *
 * Fertility (F/f) and development (D/d) are judged apart, as the letter forms of the statements
 * (EU CLP, Annex III) separate them: H360Fd at 1 % is category 1 for fertility and, below 3 %,
 * nothing for development, so the solution gets H360F. H360 and H361 without letters stay as they
 * are.
 */
import { GHS, atLeast, finding, type Finding, type RuleIngredient } from './rule-types';

type Effect = 'fertility' | 'development' | 'unspecified';
type Category = 1 | 2;

const EFFECTS_OF: Readonly<Record<string, readonly [Effect, Category][]>> = {
	H360: [['unspecified', 1]],
	H360F: [['fertility', 1]],
	H360D: [['development', 1]],
	H360FD: [
		['fertility', 1],
		['development', 1]
	],
	H360Fd: [
		['fertility', 1],
		['development', 2]
	],
	H360Df: [
		['development', 1],
		['fertility', 2]
	],
	H361: [['unspecified', 2]],
	H361f: [['fertility', 2]],
	H361d: [['development', 2]],
	H361fd: [
		['fertility', 2],
		['development', 2]
	]
};

export const REPRODUCTIVE_CODES: ReadonlySet<string> = new Set([
	...Object.keys(EFFECTS_OF),
	'H362'
]);

const LIMIT_PERCENT: Readonly<Record<Category, number>> = { 1: 0.3, 2: 3 };
const BASIS = `${GHS}, 3.7.3.3, table 3.7.1 (category 1 ≥ 0.3 %, category 2 ≥ 3 %)`;

/** [fertility, development] category → statement; 0 = not classified. */
const COMBINED: Readonly<Record<string, string>> = {
	'1,1': 'H360FD',
	'1,2': 'H360Fd',
	'1,0': 'H360F',
	'2,1': 'H360Df',
	'0,1': 'H360D',
	'2,2': 'H361fd',
	'2,0': 'H361f',
	'0,2': 'H361d'
};

interface Reached {
	category: 0 | Category;
	ingredients: RuleIngredient[];
}

function reachedFor(ingredients: readonly RuleIngredient[], effect: Effect): Reached {
	const reached: Reached = { category: 0, ingredients: [] };
	for (const ingredient of ingredients) {
		for (const code of ingredient.codes) {
			for (const [e, category] of EFFECTS_OF[code] ?? []) {
				if (e !== effect || !atLeast(ingredient.percent, LIMIT_PERCENT[category])) continue;
				if (reached.category === 0 || category < reached.category) {
					reached.category = category;
					reached.ingredients = [];
				}
				if (category === reached.category) reached.ingredients.push(ingredient);
			}
		}
	}
	return reached;
}

export function reproductiveFindings(ingredients: readonly RuleIngredient[]): Finding[] {
	const fertility = reachedFor(ingredients, 'fertility');
	const development = reachedFor(ingredients, 'development');
	const unspecified = reachedFor(ingredients, 'unspecified');
	const findings: Finding[] = [];
	const combined = COMBINED[`${fertility.category},${development.category}`];
	if (combined) {
		findings.push(finding(combined, [...fertility.ingredients, ...development.ingredients], BASIS));
	}
	if (unspecified.category !== 0) {
		const code = unspecified.category === 1 ? 'H360' : 'H361';
		findings.push(finding(code, unspecified.ingredients, BASIS));
	}
	const lactation = ingredients.filter(
		(i) => i.codes.has('H362') && atLeast(i.percent, LIMIT_PERCENT[1])
	);
	if (lactation.length > 0) findings.push(finding('H362', lactation, BASIS));
	return findings;
}
