import {
	ATOMIC_WEIGHTS,
	ChemistryInputError,
	DEFAULT_IGNORED_ELEMENTS,
	ELEMENT_ROLES,
	MAX_SOURCE_LENGTH,
	VALUE_CONFIDENCES,
	compareFractionsWithFormula,
	defaultElementRole,
	listProfileElements,
	resolveElementStatements,
	type ElementRole,
	type ElementStatement,
	type ElementStatements,
	type ProfileElementFields,
	type ValueConfidence
} from '$chemistry';
import { RuleError } from '../rule-error';

// Which elements a profile states and each one's statement: chemistry/study/profile.ts.
export type { ProfileElementFields };

export interface ProfileElementRow {
	symbol: string;
	/** g per g dry biomass, for an elemental profile. */
	fraction: number | null;
	/** null for H and O, which a study does not assess. */
	role: ElementRole | null;
	roleFrom: 'default' | 'profile';
	confidence: ValueConfidence;
	source: string | null;
}

/** The profile page's table: each element with its role and how sure its value is. */
export function describeProfileElements(p: ProfileElementFields): ProfileElementRow[] {
	const statements = resolveElementStatements(p);
	return listProfileElements(p).map((symbol) => {
		const s = statements[symbol];
		const assessed = !(DEFAULT_IGNORED_ELEMENTS as readonly string[]).includes(symbol);
		return {
			symbol,
			fraction: p.elementalFractions?.[symbol] ?? null,
			role: assessed ? (s.role ?? defaultElementRole(symbol)) : null,
			roleFrom: s.role ? 'profile' : 'default',
			confidence: s.confidence ?? 'unstated',
			source: s.source ?? null
		};
	});
}

/** The fractions against the formula, as warnings for the profile page; a formula that cannot be read says so. */
export function checkProfileFormula(p: {
	biomassFormula: string | null;
	ashFraction: number | null;
	elementalFractions: Record<string, number> | null;
}): string[] {
	if (!p.biomassFormula || !p.elementalFractions) return [];
	try {
		return compareFractionsWithFormula({
			formula: p.biomassFormula,
			ashFraction: p.ashFraction,
			fractions: p.elementalFractions
		}).map((m) => m.message);
	} catch (cause) {
		if (cause instanceof ChemistryInputError)
			return [`The fractions cannot be checked against the formula: ${cause.message}`];
		throw cause;
	}
}

/** Form field names of one element's statement. */
export const elementField = (symbol: string, part: 'role' | 'confidence' | 'source') =>
	`element.${symbol}.${part}`;

/** Each element's statement as typed: its role, confidence and source, by element symbol. */
export type ElementStatementTexts = Record<
	string,
	{ role?: string; confidence?: string; source?: string }
>;

const ELEMENT_FIELD = /^element\.([A-Z][a-z]?)\.(role|confidence|source)$/;

/** The statements a profile form carries in its fields `element.<symbol>.<part>`, as the API sends them. */
export function elementStatementTextsOf(formData: FormData): ElementStatementTexts {
	const texts: ElementStatementTexts = {};
	for (const [name, value] of formData.entries()) {
		const match = ELEMENT_FIELD.exec(name);
		if (!match || typeof value !== 'string') continue;
		const [, symbol, part] = match as unknown as [string, string, 'role' | 'confidence' | 'source'];
		const statement = (texts[symbol] ??= {});
		// The first value of a field counts, as FormData.get reads it.
		statement[part] ??= value;
	}
	return texts;
}

/**
 * Reads each element's role, confidence and source. Only elements the profile gives a value for are
 * kept; statements for elements taken out of the fractions are left behind (the form disables their
 * inputs in the browser, so they normally do not arrive at all).
 */
export function readElementStatements(
	texts: ElementStatementTexts,
	elements: string[]
): ElementStatements {
	const text = (symbol: string, part: 'role' | 'confidence' | 'source') =>
		(Object.hasOwn(texts, symbol) ? (texts[symbol][part] ?? '') : '').trim();
	const out: ElementStatements = {};
	for (const symbol of elements) {
		if (!(symbol in ATOMIC_WEIGHTS)) continue;
		const statement: ElementStatement = {};
		const role = text(symbol, 'role');
		if (role !== '') {
			if (!(ELEMENT_ROLES as readonly string[]).includes(role)) {
				throw new RuleError(`Role of ${symbol}: choose required or trace (or keep the default).`, {
					field: elementField(symbol, 'role')
				});
			}
			statement.role = role as ElementRole;
		}
		const confidence = text(symbol, 'confidence');
		if (confidence !== '') {
			if (!(VALUE_CONFIDENCES as readonly string[]).includes(confidence)) {
				throw new RuleError(
					`How sure the value of ${symbol} is: choose one of the listed grades.`,
					{ field: elementField(symbol, 'confidence') }
				);
			}
			statement.confidence = confidence as ValueConfidence;
		}
		const source = text(symbol, 'source');
		if (source.length > MAX_SOURCE_LENGTH) {
			throw new RuleError(
				`Source of ${symbol}: at most ${MAX_SOURCE_LENGTH} characters (now ${source.length}).`,
				{ field: elementField(symbol, 'source') }
			);
		}
		if (source !== '') statement.source = source;
		if (
			(statement.confidence === 'confirmed' || statement.confidence === 'derived') &&
			!statement.source
		) {
			throw new RuleError(
				`Source of ${symbol}: a published or derived value needs its source (the table or paper it comes from).`,
				{ field: elementField(symbol, 'source') }
			);
		}
		out[symbol] = statement;
	}
	return out;
}

/** The form's values for each element's statement, as the edit form starts from them. */
export function elementStatementFormValues(p: ProfileElementFields): Record<string, string> {
	const statements = resolveElementStatements(p);
	return Object.fromEntries(
		Object.entries(statements).flatMap(([symbol, s]) => [
			[elementField(symbol, 'role'), s.role ?? ''],
			[elementField(symbol, 'confidence'), s.confidence ?? 'unstated'],
			[elementField(symbol, 'source'), s.source ?? '']
		])
	);
}
