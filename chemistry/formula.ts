/**
 * Chemical formula parsing and molar masses (IUPAC 2021 standard atomic weights).
 *
 * Grammar: a formula is one or more parts joined by an adduct separator; each part is an optional
 * multiplier followed by element symbols and bracketed groups ((), [], {} nest freely), each with an
 * optional positive count that may be a decimal (`CH1.8O0.5N0.2`). Unicode subscript digits read as
 * digits. Charges are not part of a formula.
 *
 * The dot rule (see DOT_RULE): `·`, `•`, `∙`, `⋅` and `*` always separate parts, and so does a `.`
 * with a space on either side. A plain `.` between two digits is a decimal point, unless the digits
 * before it are a subscript (they follow a symbol or bracket) and the digits after it form a whole
 * number directly followed by H2O, HCl, HBr or NH3 that closes the part (end of text, a space or
 * another separator comes next): then it separates a hydrate or adduct. A plain `.`
 * not between digits cannot be a decimal point, so it separates parts. Hence `MgSO4.7H2O` is
 * MgSO4·7H2O, while `CH1.8O0.5N0.2` (after `1.` comes `8O0…`, not `8H2O` closing the part) keeps its
 * decimal subscripts. A decimal hydrate multiplier (`Na2HPO4·0.5H2O`) needs an explicit separator.
 */
import { ChemistryInputError } from './errors';
import { ATOMIC_WEIGHTS, ELEMENT_NAMES } from './data/atomic-weights';

export interface ParsedFormula {
	/** The input as given. */
	text: string;
	/** How it was read, normalised: parts joined by `·`, e.g. "MgSO4·7H2O". */
	reading: string;
	/** Element symbol -> atoms per formula unit, adduct water included. */
	elements: Record<string, number>;
	parts: { formula: string; multiplier: number }[];
}

/** The plain-dot rule as one sentence the app can show beside a formula field. */
export const DOT_RULE =
	'A plain "." between digits is read as a decimal point (CH1.8O0.5N0.2), except when it follows a subscript and the digits after it are a whole number followed by H2O, HCl, HBr or NH3 that ends the formula or part: then, like "·", "•", "*" or a "." with a space beside it, it separates a hydrate or adduct (MgSO4.7H2O = MgSO4·7H2O). A plain "." not between digits always separates (NaH2PO4.H2O). Write a fractional hydrate with "·", e.g. Na2HPO4·0.5H2O.';

const MAX_FORMULA_LENGTH = 500;
const SEPARATOR_CHARS = new Set(['·', '•', '∙', '⋅', '*']);
// Only common adducts of lab chemicals; anything else after `<digit>.<digits>` stays a decimal.
const DOT_ADDUCTS = ['H2O', 'HCl', 'HBr', 'NH3'];
const OPENERS: Record<string, string> = { '(': ')', '[': ']', '{': '}' };
const CLOSERS = new Set([')', ']', '}']);
const SUBSCRIPT_DIGITS = '₀₁₂₃₄₅₆₇₈₉';

function digitAt(text: string, i: number): string | null {
	const ch = text[i];
	if (ch === undefined) return null;
	if (ch >= '0' && ch <= '9') return ch;
	const sub = SUBSCRIPT_DIGITS.indexOf(ch);
	return sub >= 0 ? String(sub) : null;
}

function isSpace(ch: string | undefined): boolean {
	return ch !== undefined && /\s/.test(ch);
}

function isSeparatorDot(text: string, i: number): boolean {
	if (isSpace(text[i - 1]) || isSpace(text[i + 1])) return true;
	if (digitAt(text, i - 1) === null || digitAt(text, i + 1) === null) return true;
	// Digits that open a part are a multiplier (`·0.5H2O`), so their dot is decimal.
	let k = i - 1;
	while (k >= 0 && digitAt(text, k) !== null) k--;
	if (k < 0 || !/[A-Za-z)\]}]/.test(text[k])) return false;
	let j = i + 1;
	while (digitAt(text, j) !== null) j++;
	for (const adduct of DOT_ADDUCTS) {
		if (!text.startsWith(adduct, j)) continue;
		const after = text[j + adduct.length];
		if (after === undefined || isSpace(after) || after === '.' || SEPARATOR_CHARS.has(after)) {
			return true;
		}
	}
	return false;
}

interface Segment {
	start: number;
	end: number;
	separatorAt: number | null; // position of the separator before this segment
}

function splitIntoSegments(text: string): Segment[] {
	const segments: Segment[] = [];
	let start = 0;
	let separatorAt: number | null = null;
	for (let i = 0; i < text.length; i++) {
		const ch = text[i];
		if (SEPARATOR_CHARS.has(ch) || (ch === '.' && isSeparatorDot(text, i))) {
			segments.push({ start, end: i, separatorAt });
			start = i + 1;
			separatorAt = i;
		}
	}
	segments.push({ start, end: text.length, separatorAt });
	return segments;
}

function formatNumber(value: number): string {
	return String(Math.round(value * 1e9) / 1e9);
}

/** Reads an unsigned decimal number at `i`; null when no digit is there. */
function readNumber(
	text: string,
	i: number,
	end: number
): { value: number; next: number; raw: string } | null {
	let raw = '';
	let j = i;
	while (j < end && digitAt(text, j) !== null) raw += digitAt(text, j++);
	if (raw === '') return null;
	if (j < end && text[j] === '.' && digitAt(text, j + 1) !== null) {
		raw += '.';
		j++;
		while (j < end && digitAt(text, j) !== null) raw += digitAt(text, j++);
	}
	const value = Number(raw);
	if (!Number.isFinite(value)) {
		throw new ChemistryInputError(`Number '${raw}' at position ${i} is too large`, { position: i });
	}
	return { value, next: j, raw };
}

function describeChar(ch: string): string {
	return isSpace(ch) ? 'space' : `character '${ch}'`;
}

function strayCharError(text: string, i: number): ChemistryInputError {
	const ch = text[i];
	let hint = '';
	if (ch === '+' || ch === '-') hint = ': charges and negative counts are not part of a formula';
	else if (/[a-z]/.test(ch)) hint = ': element symbols start with a capital letter';
	else if (ch === '.') {
		hint =
			": a number has one decimal point with digits on both sides; write a fractional hydrate with '·' (Na2HPO4·0.5H2O)";
	}
	return new ChemistryInputError(`Unexpected ${describeChar(ch)} at position ${i}${hint}`, {
		position: i
	});
}

function addInto(target: Map<string, number>, symbol: string, count: number): void {
	target.set(symbol, (target.get(symbol) ?? 0) + count);
}

/** Parses one part's body (after its multiplier) into element counts. */
function parseBody(text: string, start: number, end: number): Map<string, number> {
	const stack: { counts: Map<string, number>; opener: string; position: number }[] = [
		{ counts: new Map(), opener: '', position: start }
	];
	let i = start;
	while (i < end) {
		const ch = text[i];
		if (ch >= 'A' && ch <= 'Z') {
			let symbol = ch;
			if (i + 1 < end && text[i + 1] >= 'a' && text[i + 1] <= 'z') symbol += text[i + 1];
			if (!(symbol in ELEMENT_NAMES)) {
				throw new ChemistryInputError(`Unknown element '${symbol}' at position ${i}`, {
					position: i
				});
			}
			if (!(symbol in ATOMIC_WEIGHTS)) {
				throw new ChemistryInputError(
					`Element '${symbol}' at position ${i} has no IUPAC standard atomic weight, so it has no molar mass`,
					{ position: i }
				);
			}
			const countAt = i + symbol.length;
			const count = readNumber(text, countAt, end);
			if (count && count.value === 0) {
				throw new ChemistryInputError(
					`Count of ${symbol} at position ${countAt} must be positive, not 0`,
					{
						position: countAt
					}
				);
			}
			addInto(stack[stack.length - 1].counts, symbol, count ? count.value : 1);
			i = count ? count.next : countAt;
		} else if (ch in OPENERS) {
			stack.push({ counts: new Map(), opener: ch, position: i });
			i++;
		} else if (CLOSERS.has(ch)) {
			const group = stack[stack.length - 1];
			if (stack.length === 1) {
				throw new ChemistryInputError(`Unbalanced '${ch}' at position ${i}: nothing was opened`, {
					position: i
				});
			}
			if (OPENERS[group.opener] !== ch) {
				throw new ChemistryInputError(
					`Mismatched '${ch}' at position ${i}: '${group.opener}' opened at position ${group.position} needs '${OPENERS[group.opener]}'`,
					{ position: i }
				);
			}
			if (group.counts.size === 0) {
				throw new ChemistryInputError(`Empty brackets at position ${group.position}`, {
					position: group.position
				});
			}
			const count = readNumber(text, i + 1, end);
			if (count && count.value === 0) {
				throw new ChemistryInputError(`Group count at position ${i + 1} must be positive, not 0`, {
					position: i + 1
				});
			}
			const factor = count ? count.value : 1;
			stack.pop();
			const parent = stack[stack.length - 1].counts;
			for (const [symbol, n] of group.counts) addInto(parent, symbol, n * factor);
			i = count ? count.next : i + 1;
		} else {
			throw strayCharError(text, i);
		}
	}
	if (stack.length > 1) {
		const open = stack[stack.length - 1];
		throw new ChemistryInputError(
			`Unbalanced '${open.opener}' at position ${open.position}: it is never closed`,
			{
				position: open.position
			}
		);
	}
	return stack[0].counts;
}

export function parseFormula(text: string): ParsedFormula {
	if (typeof text !== 'string') {
		throw new ChemistryInputError('Formula must be text', { position: 0 });
	}
	if (text.trim() === '') throw new ChemistryInputError('Formula is empty', { position: 0 });
	if (text.length > MAX_FORMULA_LENGTH) {
		throw new ChemistryInputError(`Formula is longer than ${MAX_FORMULA_LENGTH} characters`, {
			position: MAX_FORMULA_LENGTH
		});
	}
	const totals = new Map<string, number>();
	const parts: ParsedFormula['parts'] = [];
	for (const segment of splitIntoSegments(text)) {
		let start = segment.start;
		let end = segment.end;
		while (start < end && isSpace(text[start])) start++;
		while (end > start && isSpace(text[end - 1])) end--;
		if (start === end) {
			const position = segment.separatorAt ?? segment.end;
			const where = segment.separatorAt === null ? 'before' : 'after';
			throw new ChemistryInputError(
				`Expected a formula ${where} the separator '${text[segment.separatorAt ?? segment.end]}' at position ${position}`,
				{ position }
			);
		}
		const multiplier = readNumber(text, start, end);
		if (multiplier && multiplier.value === 0) {
			throw new ChemistryInputError(`Multiplier at position ${start} must be positive, not 0`, {
				position: start
			});
		}
		const bodyStart = multiplier ? multiplier.next : start;
		if (bodyStart === end) {
			throw new ChemistryInputError(
				`Expected a formula after the multiplier at position ${start}`,
				{
					position: start
				}
			);
		}
		const factor = multiplier ? multiplier.value : 1;
		for (const [symbol, n] of parseBody(text, bodyStart, end)) addInto(totals, symbol, n * factor);
		let formula = '';
		for (let i = bodyStart; i < end; i++) formula += digitAt(text, i) ?? text[i];
		parts.push({ formula, multiplier: factor });
	}
	const elements: Record<string, number> = {};
	for (const [symbol, n] of totals) elements[symbol] = Math.round(n * 1e9) / 1e9;
	const reading = parts
		.map((p) => (p.multiplier === 1 ? '' : formatNumber(p.multiplier)) + p.formula)
		.join('·');
	return { text, reading, elements, parts };
}

/** Molar mass in g/mol of an element-count map, from IUPAC 2021 standard atomic weights. */
export function molarMassOf(elements: Record<string, number>): number {
	let molarMassGPerMol = 0;
	let any = false;
	for (const symbol of Object.keys(elements)) {
		const weight = ATOMIC_WEIGHTS[symbol];
		if (weight === undefined) {
			throw new ChemistryInputError(
				`Unknown element '${symbol}' or one with no standard atomic weight`,
				{
					field: symbol
				}
			);
		}
		const count = elements[symbol];
		if (typeof count !== 'number' || !Number.isFinite(count) || count < 0) {
			throw new ChemistryInputError(`Count of ${symbol} must be a non-negative number`, {
				field: symbol
			});
		}
		if (count > 0) any = true;
		molarMassGPerMol += weight * count;
	}
	if (!any) throw new ChemistryInputError('A molar mass needs at least one element');
	return molarMassGPerMol;
}

const molarMassCache = new Map<string, number>();

/** Molar mass in g/mol of a formula text; results are cached per text. */
export function formulaMolarMass(text: string): number {
	const cached = molarMassCache.get(text);
	if (cached !== undefined) return cached;
	const molarMassGPerMol = molarMassOf(parseFormula(text).elements);
	if (molarMassCache.size > 10_000) molarMassCache.clear();
	molarMassCache.set(text, molarMassGPerMol);
	return molarMassGPerMol;
}
