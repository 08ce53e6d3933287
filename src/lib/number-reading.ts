/**
 * The one way a number typed by a person or read from a file becomes a value: every form, the API's
 * text fields and every CSV import read through `readDecimalText`, and every "read as" beside a field
 * shows what it read. Shared by server and browser, so it holds no server code.
 *
 * The site chooses its decimal mark (Settings; default the point). The other mark is never guessed:
 * - at a point site "1,5" is refused (the decimal mark here is a point) and "1,500" is refused as a
 *   thousands separator, which could mean 1.5 or 1500;
 * - at a comma site "1,5" is 1.5, "1.5" and "1234.5" are still read (every figure the app shows is
 *   written with a point), and "1.500" is refused as ambiguous;
 * - spaces, apostrophes and thin spaces inside a number are group separators and refused;
 * - an exponent is read ("2e-3", "2,5e-3" at a comma site); "−" (the minus sign) is a minus.
 */

export type DecimalMark = 'point' | 'comma';
export const DECIMAL_MARKS: readonly DecimalMark[] = ['point', 'comma'];
export const DECIMAL_MARK_LABELS: Record<DecimalMark, string> = {
	point: 'Point (1.5)',
	comma: 'Comma (1,5)'
};

// The site's mark is set once per request on the server (hooks) and from the layout's data in the
// browser, so the many readers (zod schemas, CSV rows, lot forms) need no extra argument threaded
// through them; an explicit `mark` argument still wins.
let siteMark: DecimalMark = 'point';

export function setSiteDecimalMark(mark: DecimalMark): void {
	siteMark = mark;
}

export function siteDecimalMark(): DecimalMark {
	return siteMark;
}

export type DecimalRead = { ok: true; value: number } | { ok: false; message: string };

const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const GROUP_MARK = "[\\s'’\\u00a0\\u202f\\u2009]";
/** "1 500", "1'500,25": a space, apostrophe or thin space between groups of three digits. */
const SPACE_GROUPS = new RegExp(`^[+-]?\\d{1,3}(${GROUP_MARK}\\d{3})+([.,]\\d*)?$`);

function refuse(label: string, message: string): DecimalRead {
	return { ok: false, message: `${label}: ${message}` };
}

/** "1,500", "12,345,678.5": a comma in thousands-separator position. */
const COMMA_GROUPS = /^[+-]?[1-9]\d{0,2}(,\d{3})+(\.\d*)?$/;
/** "1.500", "1.234.567,5": a point in thousands-separator position. */
const POINT_GROUPS = /^[+-]?[1-9]\d{0,2}(\.\d{3})+(,\d*)?$/;

function atPointSite(digits: string, label: string): DecimalRead | string {
	if (!digits.includes(',')) return digits;
	if (COMMA_GROUPS.test(digits)) {
		const plain = digits.replace(/,/g, '');
		const decimal = String(Number(digits.replace(',', '.')));
		return refuse(
			label,
			/,\d{3}$/.test(digits) && (digits.match(/,/g) ?? []).length === 1
				? `“${digits}” is ambiguous: it could be ${decimal} or ${plain}. This site writes decimals with a point and no thousands separator: type ${plain} or ${decimal}.`
				: `“${digits}” has thousands separators, which are not read (they could be decimal commas): type ${plain}.`
		);
	}
	if (/^[+-]?\d*,\d+([eE][+-]?\d+)?$/.test(digits))
		return refuse(
			label,
			`“${digits}” has a decimal comma, but this site writes decimals with a point: type ${digits.replace(',', '.')}.`
		);
	return refuse(label, `“${digits}” is not a number.`);
}

function atCommaSite(digits: string, label: string): DecimalRead | string {
	const commas = (digits.match(/,/g) ?? []).length;
	const points = (digits.match(/\./g) ?? []).length;
	if (POINT_GROUPS.test(digits)) {
		const plain = digits.replace(/\./g, '');
		const decimal = String(Number(digits)).replace('.', ',');
		return refuse(
			label,
			points === 1 && commas === 0
				? `“${digits}” is ambiguous: it could be ${decimal} or ${plain}. This site writes decimals with a comma and no thousands separator: type ${plain} or ${decimal}.`
				: `“${digits}” has thousands separators, which are not read: type ${plain}.`
		);
	}
	if (commas && points)
		return refuse(label, `“${digits}” mixes commas and points; type it with one decimal mark.`);
	if (commas > 1) return refuse(label, `“${digits}” has more than one decimal comma.`);
	return digits.replace(',', '.');
}

/**
 * Reads a number as a person types it, by the site's decimal mark (or `mark`). `label` names the
 * field in the message, which always quotes what was typed.
 */
export function readDecimalText(
	text: string,
	label: string,
	mark: DecimalMark = siteMark
): DecimalRead {
	const digits = text.trim().replace(/^−/, '-');
	if (digits === '') return refuse(label, 'enter a number.');
	if (SPACE_GROUPS.test(digits))
		return refuse(
			label,
			`“${digits}” has a thousands separator (a space or apostrophe), which is not read: type ${digits.replace(new RegExp(GROUP_MARK, 'g'), '')}.`
		);
	const normal = mark === 'point' ? atPointSite(digits, label) : atCommaSite(digits, label);
	if (typeof normal !== 'string') return normal;
	if (!PLAIN_NUMBER.test(normal)) return refuse(label, `“${digits}” is not a number.`);
	const value = Number(normal);
	if (!Number.isFinite(value)) return refuse(label, `“${digits}” is too large to be a number.`);
	return { ok: true, value };
}

/** A number written the way the site reads it back: its decimal mark, no thousands separator. */
export function formatReadNumber(value: number, mark: DecimalMark = siteMark): string {
	const plain = String(value);
	return mark === 'comma' ? plain.replace('.', ',') : plain;
}

/**
 * A stored or computed number as plain text for files and form fields: point mark, no thousands
 * groups, and no binary noise (53.489000000000004 is 53.489). Twelve significant digits keep every
 * digit a person typed or a table gives.
 */
export function storedNumberText(value: number): string {
	return Number.isFinite(value) ? String(Number(value.toPrecision(12))) : '';
}

/** For a schema that checks the number afterwards: NaN when the text is not one. */
export function decimalOrNaN(text: string): number {
	const read = readDecimalText(text, 'Number');
	return read.ok ? read.value : NaN;
}

/** A typed number by the one rule, or null when it is not one. */
export function numberOrNull(text: string): number | null {
	const read = readDecimalText(text, 'Number');
	return read.ok ? read.value : null;
}
