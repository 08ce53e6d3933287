/**
 * Physical hazards of a solution. The standard classifies these by testing the mixture (UN GHS
 * Rev. 10, chapter 2), not by calculation from its ingredients, so:
 * - H290 (corrosive to metals, 2.16) is kept when the ingredients carrying it make up ≥ 1 % of
 *   the solution: common practice, not the standard, which asks for a test.
 * - H272 (oxidising liquids and solids, 2.13/2.14) is dropped for an aqueous solution whose
 *   oxidising ingredients make up < 10 %: common practice, not the standard.
 * - Every other physical statement (flammable, explosive, gases …) is carried over from the
 *   ingredient as it stands: flash points and the like need a test, and keeping them errs on the
 *   safe side.
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

export const PHYSICAL_RULE_CODES: ReadonlySet<string> = new Set(['H290', 'H272']);

export function physicalFindings(
	ingredients: readonly RuleIngredient[],
	aqueous: boolean
): Finding[] {
	const findings: Finding[] = [];
	const metalCorroding = carrying(ingredients, 'H290');
	if (atLeast(percentOf(metalCorroding), 1)) {
		const basis = `${GHS}, 2.16 asks for a test; kept from 1 % of such ingredients (common practice)`;
		findings.push(finding('H290', metalCorroding, basis, true));
	}
	const oxidisers = carrying(ingredients, 'H272');
	if (oxidisers.length > 0 && !aqueous) {
		findings.push(
			finding('H272', oxidisers, `${GHS}, 2.14: carried over (not an aqueous solution)`)
		);
	} else if (atLeast(percentOf(oxidisers), 10)) {
		const basis = `${GHS}, 2.13/2.14 ask for a test; an aqueous solution keeps it from 10 % (common practice)`;
		findings.push(finding('H272', oxidisers, basis, true));
	}
	return findings;
}
