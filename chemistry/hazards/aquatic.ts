/**
 * Aquatic hazards of a mixture by the summation method, UN GHS Rev. 10, 4.1.3.5.5 (tables of
 * the summation for short-term and long-term hazards): with every M-factor taken as 1,
 *   Acute 1:   Σ Acute 1 ≥ 25 %
 *   Acute 2:   10 × Acute 1 + Acute 2 ≥ 25 %
 *   Acute 3:   100 × Acute 1 + 10 × Acute 2 + Acute 3 ≥ 25 %
 *   Chronic 1: Σ Chronic 1 ≥ 25 %
 *   Chronic 2: 10 × Chronic 1 + Chronic 2 ≥ 25 %
 *   Chronic 3: 100 × Chronic 1 + 10 × Chronic 2 + Chronic 3 ≥ 25 %
 *   Chronic 4: Chronic 1 + 2 + 3 + 4 ≥ 25 %
 * over relevant ingredients: Acute 1 and Chronic 1 from 0.1 %, the others from 1 % (4.1.3.5.5).
 *
 * Simplifications: M-factor 1 for every ingredient (a very toxic one may carry 10 or more, which
 * the component data do not hold); Acute 2 and 3 (optional) only when an ingredient carries one;
 * H410 read as Chronic 1 only, not also as Acute 1.
 */
import {
	GHS,
	atLeast,
	carrying,
	finding,
	percentOf,
	type Finding,
	type RuleIngredient
} from './rule-types';

export const AQUATIC_CODES: ReadonlySet<string> = new Set([
	'H400',
	'H401',
	'H402',
	'H410',
	'H411',
	'H412',
	'H413'
]);

const BASIS = `${GHS}, 4.1.3.5.5 (summation, M-factor 1)`;

function relevantCarriers(
	ingredients: readonly RuleIngredient[],
	code: string,
	mostSevere: boolean
) {
	return carrying(ingredients, code).filter((i) => atLeast(i.percent, mostSevere ? 0.1 : 1));
}

/** The first rung of the ladder whose weighted sum reaches 25 %: [statement, weights per rung]. */
function summation(
	ingredients: readonly RuleIngredient[],
	codes: readonly string[],
	rungs: readonly (readonly [string, readonly number[]])[]
): Finding[] {
	const carriers = codes.map((code, i) => relevantCarriers(ingredients, code, i === 0));
	for (const [statement, weights] of rungs) {
		const sum = weights.reduce((s, w, i) => s + w * percentOf(carriers[i]), 0);
		if (atLeast(sum, 25)) {
			const contributors = carriers.flatMap((c, i) => ((weights[i] ?? 0) > 0 ? c : []));
			return [finding(statement, contributors, BASIS)];
		}
	}
	return [];
}

export function aquaticFindings(ingredients: readonly RuleIngredient[]): Finding[] {
	const acuteOptionalInUse = carrying(ingredients, 'H401', 'H402').length > 0;
	const acute = summation(
		ingredients,
		['H400', 'H401', 'H402'],
		[
			['H400', [1]],
			...(acuteOptionalInUse
				? ([
						['H401', [10, 1]],
						['H402', [100, 10, 1]]
					] as const)
				: [])
		]
	);
	const chronic = summation(
		ingredients,
		['H410', 'H411', 'H412', 'H413'],
		[
			['H410', [1]],
			['H411', [10, 1]],
			['H412', [100, 10, 1]],
			['H413', [1, 1, 1, 1]]
		]
	);
	return [...acute, ...chronic];
}
