// The acids and bases a pH step uses, each as the working solution a bench usually holds, so the
// step's cautions are those of what the technician pours, at its strength.
//
// Hazard statements: from memory, as the usual supplier data sheets give them for the working
// strengths named; the supplier SDS is authoritative. Mass fractions: molar mass × 1 mol/L over a
// density of about 1.04 g/mL (hand calculation), or the strength as sold. pH of a 1 M strong acid or
// base: 0 and 14 by definition of pH for unit activity (approximate: activity coefficients ignored).
import type { GhsHazard } from '../components';
import { classifySolution, type SolutionClassification } from './mixture';
import { hazardStatementInfo } from './classes';

export interface PhAdjuster {
	id: string;
	name: string;
	/** How recipes usually name it in their instructions. */
	pattern: RegExp;
	workingSolution: string;
	/** g per g of the working solution. */
	massFraction: number;
	/** pH of the working solution, for the standard's extreme-pH rule. */
	pH: number;
	/** The pure substance's statements. */
	hazardCodes: string[];
}

export const PH_ADJUSTERS: readonly PhAdjuster[] = [
	{
		id: 'sodium-hydroxide',
		name: 'Sodium hydroxide',
		pattern: /\b(NaOH|sodium hydroxide|caustic soda)\b/i,
		workingSolution: '1 M (about 3.8 % w/w)',
		massFraction: 0.038,
		pH: 14,
		hazardCodes: ['H290', 'H314']
	},
	{
		id: 'potassium-hydroxide',
		name: 'Potassium hydroxide',
		pattern: /\b(KOH|potassium hydroxide)\b/i,
		workingSolution: '1 M (about 5.4 % w/w)',
		massFraction: 0.054,
		pH: 14,
		hazardCodes: ['H290', 'H302', 'H314']
	},
	{
		id: 'hydrochloric-acid',
		name: 'Hydrochloric acid',
		pattern: /\b(HCl|hydrochloric acid)\b/i,
		workingSolution: '1 M (about 3.5 % w/w)',
		massFraction: 0.035,
		pH: 0,
		hazardCodes: ['H290', 'H314', 'H335']
	},
	{
		id: 'sulfuric-acid',
		name: 'Sulfuric acid',
		pattern: /\b(H2SO4|sulfuric acid|sulphuric acid)\b/i,
		workingSolution: '1 M (about 9.4 % w/w)',
		massFraction: 0.094,
		pH: 0,
		hazardCodes: ['H290', 'H314']
	},
	{
		id: 'phosphoric-acid',
		name: 'Phosphoric acid',
		pattern: /\b(H3PO4|phosphoric acid)\b/i,
		workingSolution: '1 M (about 9.4 % w/w)',
		massFraction: 0.094,
		pH: 1,
		hazardCodes: ['H290', 'H314']
	},
	{
		id: 'ammonia-solution',
		name: 'Ammonia solution',
		pattern: /\b(ammonia( solution)?|ammonium hydroxide|NH4OH)\b/i,
		workingSolution: '25 % as sold',
		massFraction: 1,
		pH: 12,
		hazardCodes: ['H290', 'H314', 'H335', 'H400']
	},
	{
		id: 'acetic-acid',
		name: 'Acetic acid',
		pattern: /\b(acetic acid)\b/i,
		workingSolution: '1 M (about 6 % w/w)',
		massFraction: 0.06,
		pH: 2.4,
		hazardCodes: ['H226', 'H314']
	}
];

/** The acids and bases a recipe's instructions name, in table order. */
export function phAdjustersNamedIn(text: string): PhAdjuster[] {
	return PH_ADJUSTERS.filter((a) => a.pattern.test(text));
}

function statementsOf(codes: string[]): GhsHazard[] {
	return codes.map((code) => ({ code, text: hazardStatementInfo(code)?.text ?? code }));
}

/** The working solution's statements at its strength and pH (UN GHS mixture rules). */
export function classifyPhAdjuster(adjuster: PhAdjuster): SolutionClassification {
	return classifySolution(
		[
			{
				name: adjuster.name,
				massFraction: adjuster.massFraction,
				hazards: statementsOf(adjuster.hazardCodes)
			}
		],
		{ pH: adjuster.pH }
	);
}
