import Papa from 'papaparse';
import { FORMULA_START } from '$lib/csv-formula';
import { storedNumberText } from '$lib/number-reading';
import { RuleError } from './rule-error';

export const MAX_CSV_BYTES = 1_000_000;

export interface CsvTable {
	/** Header names as written, lower-cased and trimmed. */
	columns: string[];
	/** Each data row with the line number a spreadsheet shows (the header is row 1). */
	rows: { rowNumber: number; values: Record<string, string> }[];
}

export interface CsvRowResult<T> {
	rowNumber: number;
	values: Record<string, string>;
	errors: string[];
	value?: T;
}

/**
 * Parses CSV text with a header row. Columns outside `allowed`, or `required` ones missing, refuse the
 * whole file with one message listing the expected columns.
 */
export function parseCsv(
	text: string,
	columns: { required: readonly string[]; allowed: readonly string[] }
): CsvTable {
	if (text.length > MAX_CSV_BYTES)
		throw new RuleError(`The file is larger than ${MAX_CSV_BYTES / 1_000_000} MB; split it.`, {
			field: 'csv'
		});
	const body = text.replace(/^\uFEFF/, '');
	if (!body.trim())
		throw new RuleError('The CSV is empty: paste the rows or choose a file.', { field: 'csv' });
	const parsed = Papa.parse<string[]>(body, { skipEmptyLines: 'greedy', comments: '#' });
	const fatal = parsed.errors.find((e) => e.type === 'Quotes' || e.type === 'Delimiter');
	if (fatal) {
		throw new RuleError(
			`The CSV cannot be read at row ${(fatal.row ?? 0) + 1}: ${fatal.message}.`,
			{ field: 'csv' }
		);
	}
	const [header = [], ...data] = parsed.data;
	const names = header.map((h) => h.trim().toLowerCase());
	const expected = `Expected columns: ${columns.required.join(', ')} (required)${
		columns.allowed.length > columns.required.length
			? `, and optionally ${columns.allowed.filter((c) => !columns.required.includes(c)).join(', ')}`
			: ''
	}.`;
	const unknown = names.filter((n) => !columns.allowed.includes(n));
	const missing = columns.required.filter((c) => !names.includes(c));
	const repeated = names.filter((n, i) => names.indexOf(n) !== i);
	if (unknown.length || missing.length || repeated.length) {
		const problems = [
			unknown.length
				? `unknown column${unknown.length > 1 ? 's' : ''} ${unknown.map((u) => `“${u}”`).join(', ')}`
				: '',
			missing.length ? `missing ${missing.join(', ')}` : '',
			repeated.length ? `repeated ${[...new Set(repeated)].join(', ')}` : ''
		].filter(Boolean);
		throw new RuleError(`The columns are not right: ${problems.join('; ')}. ${expected}`, {
			field: 'csv'
		});
	}
	// Row numbers as a spreadsheet shows them: count the physical lines, comments included.
	const lineNumbers: number[] = [];
	body.split(/\r\n|\n|\r/).forEach((line, i) => {
		if (line.trim() && !line.startsWith('#')) lineNumbers.push(i + 1);
	});
	return {
		columns: names,
		rows: data.map((cells, i) => ({
			rowNumber: lineNumbers[i + 1] ?? i + 2,
			values: Object.fromEntries(names.map((n, c) => [n, unescapeFormula((cells[c] ?? '').trim())]))
		}))
	};
}

export { FORMULA_START };

/**
 * Every CSV this app writes goes through here. Papaparse puts an apostrophe before a formula-looking
 * text cell and leaves numbers alone: a ledger's -200 must stay a number a spreadsheet can sum, and a
 * number cannot carry a formula, so only strings are escaped.
 */
export function unparseCsv(fields: readonly string[], data: unknown[][]): string {
	return Papa.unparse({ fields: [...fields], data }, { escapeFormulae: FORMULA_START });
}

/** Rows without a header, escaped as `unparseCsv` does: a later chunk of a streamed export. */
export function unparseCsvRows(data: unknown[][]): string {
	return Papa.unparse(data, { escapeFormulae: FORMULA_START });
}

/** Undoes `unparseCsv`'s apostrophe, so an exported file imports back to what was stored. */
function unescapeFormula(cell: string): string {
	return cell.startsWith("'") && FORMULA_START.test(cell.slice(1)) ? cell.slice(1) : cell;
}

/** Numbers without binary noise (kept as numbers, so no formula escape); the rest as it is. */
const cellText = (value: unknown) =>
	typeof value === 'number'
		? Number.isFinite(value)
			? Number(storedNumberText(value))
			: ''
		: (value ?? '');

export function toCsv(
	rows: Record<string, unknown>[],
	columns: string[],
	comments: string[] = []
): string {
	const header = comments.map((c) => `# ${c.replace(/[\r\n]+/g, ' ')}`).join('\r\n');
	const table = unparseCsv(
		columns,
		rows.map((r) => columns.map((c) => cellText(r[c])))
	);
	return header ? `${header}\r\n${table}` : table;
}

export function csvHeaders(filename: string): Record<string, string> {
	const safe = filename.replace(/[^\w.-]+/g, '-');
	return {
		'content-type': 'text/csv; charset=utf-8',
		'content-disposition': `attachment; filename="${safe}"`
	};
}

export function csvDownload(csv: string, filename: string): Response {
	return new Response(csv, { headers: csvHeaders(filename) });
}

/** The CSV text of an import form: the uploaded file if one was chosen, else the pasted text. */
export async function csvTextFrom(formData: FormData): Promise<string> {
	const file = formData.get('file');
	if (file instanceof File && file.size > 0) {
		if (file.size > MAX_CSV_BYTES)
			throw new RuleError(`The file is larger than ${MAX_CSV_BYTES / 1_000_000} MB; split it.`, {
				field: 'csv'
			});
		return await file.text();
	}
	const text = formData.get('csv');
	return typeof text === 'string' ? text : '';
}
