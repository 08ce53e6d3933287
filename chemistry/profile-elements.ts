/**
 * What a biomass profile says about each of its elements: the role the element plays in a
 * sufficiency assessment (required or trace, see data/element-roles.ts) and how sure its value is.
 * Also the check that a profile's elemental fractions agree with its biomass formula.
 */
import { ATOMIC_WEIGHTS } from './data/atomic-weights';
import { organicMassFractions, type BiomassComposition, type Confidence } from './data/biomass';
import { ELEMENT_ROLES, type ElementRole } from './data/element-roles';
import { ChemistryInputError } from './errors';
import { parseFormula } from './formula';

/**
 * How sure a composition value is: the three grades of the published tables in data/biomass.ts
 * ('confirmed' printed in the cited source, 'derived' computed from confirmed inputs, 'from memory'),
 * 'measured' for the user's own analysis, and 'unstated' for a value given without saying.
 */
export type ValueConfidence = Confidence | 'measured' | 'unstated';

export const VALUE_CONFIDENCES = [
	'confirmed',
	'derived',
	'from memory',
	'measured',
	'unstated'
] as const satisfies readonly ValueConfidence[];

/** The confidence in words, as forms, reports and warnings show it. */
export const VALUE_CONFIDENCE_WORDS: Readonly<Record<ValueConfidence, string>> = {
	confirmed: 'published',
	derived: 'derived from published values',
	'from memory': 'from memory',
	measured: 'measured',
	unstated: 'source not stated'
};

/** What a profile states about one element; each part is optional. */
export interface ElementStatement {
	/** Overrides the default role of the element. */
	role?: ElementRole;
	confidence?: ValueConfidence;
	/** The citation or the analysis the value comes from. */
	source?: string;
}

export const MAX_SOURCE_LENGTH = 400;

/** What a published table says about each of its values: the value's grade and the table's citation. */
export function statementsOfComposition(
	composition: BiomassComposition
): Record<string, ElementStatement> {
	return Object.fromEntries(
		Object.entries(composition.massFractions).map(([symbol, v]) => [
			symbol,
			{ confidence: v.confidence, source: composition.source }
		])
	);
}

function fail(message: string, field: string): never {
	throw new ChemistryInputError(message, { field });
}

/**
 * Reads a map of element statements, refusing a key that is not an element the profile carries
 * (`present`), an unknown role or confidence, or an over-long source.
 */
export function readElementStatements(
	value: unknown,
	field: string,
	present: ReadonlySet<string>
): Record<string, ElementStatement> {
	if (value === undefined || value === null) return {};
	if (typeof value !== 'object' || Array.isArray(value))
		fail('Element statements must be an object keyed by element symbol', field);
	const out: Record<string, ElementStatement> = {};
	for (const [symbol, raw] of Object.entries(value as Record<string, unknown>)) {
		const at = `${field}.${symbol}`;
		if (!(symbol in ATOMIC_WEIGHTS)) fail(`'${symbol}' is not an element symbol`, at);
		if (!present.has(symbol))
			fail(
				`${symbol} has a statement but no value in this profile; give its value or drop the statement`,
				at
			);
		if (raw === null || typeof raw !== 'object' || Array.isArray(raw))
			fail(`The statement on ${symbol} must be an object with role, confidence or source`, at);
		const { role, confidence, source } = raw as Record<string, unknown>;
		const statement: ElementStatement = {};
		if (role !== undefined) {
			if (!(ELEMENT_ROLES as readonly unknown[]).includes(role))
				fail(`Role of ${symbol} must be one of ${ELEMENT_ROLES.join(', ')}`, `${at}.role`);
			statement.role = role as ElementRole;
		}
		if (confidence !== undefined) {
			if (!(VALUE_CONFIDENCES as readonly unknown[]).includes(confidence))
				fail(
					`Confidence of ${symbol} must be one of ${VALUE_CONFIDENCES.join(', ')}`,
					`${at}.confidence`
				);
			statement.confidence = confidence as ValueConfidence;
		}
		if (source !== undefined) {
			if (typeof source !== 'string' || source.length > MAX_SOURCE_LENGTH)
				fail(
					`Source of ${symbol} must be text of at most ${MAX_SOURCE_LENGTH} characters`,
					`${at}.source`
				);
			if (source.trim() !== '') statement.source = source.trim();
		}
		out[symbol] = statement;
	}
	return out;
}

/**
 * Fractions and formula disagree when an element's entered fraction is more than this far from the
 * formula's, in g per g (1 percentage point). Rounding a formula's subscripts to two decimals moves
 * a fraction by at most about 0.3 points; two different compositions (the standard formula against
 * the Neidhardt table) differ by 3.5 points in N and 10 in O.
 */
export const FORMULA_FRACTION_TOLERANCE_G_PER_G = 0.01;

export interface FormulaFractionMismatch {
	element: string;
	enteredFraction: number;
	formulaFraction: number;
	message: string;
}

/** A fraction as a percentage of three significant digits, e.g. 0.10472 → "10.5". */
export function formatPercentOfDryMass(fraction: number): string {
	return String(Number((fraction * 100).toPrecision(3)));
}

/**
 * Compares each element a profile gives both as a fraction and in its ash-free per-C-mol formula:
 * the formula's fraction is (A_el · n_el / M_formula) · (1 − ash), IUPAC 2021 atomic weights. With no
 * ash fraction the formula is taken as the whole dry mass, and the message says so.
 */
export function compareFractionsWithFormula(input: {
	formula: string;
	ashFraction: number | null;
	fractions: Readonly<Record<string, number>>;
	/** The path of the formula in the caller's input, for an error. */
	field?: string;
}): FormulaFractionMismatch[] {
	const field = input.field ?? 'formula';
	let counts: Record<string, number>;
	try {
		counts = parseFormula(input.formula).elements;
	} catch (cause) {
		if (cause instanceof ChemistryInputError) fail(`Biomass formula: ${cause.message}`, field);
		throw cause;
	}
	const ash = input.ashFraction ?? 0;
	if (!(ash >= 0 && ash < 1))
		fail(`Ash fraction must be at least 0 and below 1, not ${ash}`, 'ashFraction');
	const byFormula = organicMassFractions(counts, ash);
	const withAsh =
		input.ashFraction === null
			? 'with no ash entered'
			: `with ${formatPercentOfDryMass(ash)} % ash`;
	const out: FormulaFractionMismatch[] = [];
	for (const [element, formulaFraction] of Object.entries(byFormula)) {
		const enteredFraction = input.fractions[element];
		if (enteredFraction === undefined) continue;
		if (Math.abs(enteredFraction - formulaFraction) <= FORMULA_FRACTION_TOLERANCE_G_PER_G) continue;
		out.push({
			element,
			enteredFraction,
			formulaFraction,
			message: `${element} is ${formatPercentOfDryMass(enteredFraction)} % in the fractions but ${formatPercentOfDryMass(formulaFraction)} % by the formula ${input.formula} ${withAsh}: more than ${FORMULA_FRACTION_TOLERANCE_G_PER_G * 100} percentage point apart, so the demand and the element balance would describe different cells. Correct the fractions or the formula.`
		});
	}
	return out;
}
