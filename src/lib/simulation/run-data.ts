// Reading a run's CSV for the growth fit: file checks, column mapping and a verdict per row.
// Runs in the browser (preview before anything is sent) and in tests.
import Papa from 'papaparse';
import { visibleText } from '$lib/plain-text';
import { numberOrNull as readNumberText } from '$lib/number-reading';

export const MAX_UPLOAD_BYTES = 2 * 1024 * 1024;
const TEXT_TYPES = new Set([
	'',
	'text/csv',
	'text/plain',
	'application/csv',
	'application/vnd.ms-excel',
	'text/comma-separated-values'
]);

/** Refuses what cannot be a CSV before reading it: wrong extension or type, empty, too large. */
export function checkUploadFile(file: { name: string; size: number; type: string }): string | null {
	const name = visibleText(file.name);
	if (!/\.(csv|txt|tsv)$/i.test(file.name)) return `“${name}” is not a .csv, .tsv or .txt file.`;
	if (!TEXT_TYPES.has(file.type)) return `“${name}” is of type ${file.type}, not text or CSV.`;
	if (file.size === 0) return `“${name}” is empty.`;
	if (file.size > MAX_UPLOAD_BYTES) {
		return `“${name}” is ${(file.size / 1024 / 1024).toFixed(1)} MB; the limit is ${MAX_UPLOAD_BYTES / 1024 / 1024} MB.`;
	}
	return null;
}

/** A renamed spreadsheet or image carries NUL bytes or undecodable runs; text does not. */
export function checkTextContent(text: string): string | null {
	const sample = text.slice(0, 8192);
	if (sample.includes('\u0000'))
		return 'The file holds binary data, not text; export the sheet as CSV.';
	const undecodable = sample.split('\uFFFD').length - 1;
	if (undecodable > Math.max(4, sample.length / 100))
		return 'The file is not readable text (UTF-8); export the sheet as CSV.';
	return null;
}

export interface RunDataTable {
	columns: string[];
	/** data rows with the line number each has in the file (header = line 1) */
	rows: { line: number; cells: string[] }[];
	blankLines: number;
}

export function parseRunDataCsv(text: string): RunDataTable {
	const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: false });
	const [header = [], ...body] = parsed.data;
	const rows: RunDataTable['rows'] = [];
	let blankLines = 0;
	body.forEach((cells, i) => {
		if (cells.every((c) => c.trim() === '')) {
			if (i < body.length - 1) blankLines++;
			return;
		}
		rows.push({ line: i + 2, cells });
	});
	return { columns: header.map((c) => c.trim()), rows, blankLines };
}

export type BiomassUnit = 'gPerL' | 'od';

export interface ColumnMapping {
	time: string;
	biomass: string;
	biomassUnit: BiomassUnit;
	/** g/L per OD unit, as typed */
	gPerLPerOd: string;
	/** '' when the run has no such column */
	substrate: string;
	dissolvedOxygen: string;
}

export function guessColumnMapping(columns: string[]): ColumnMapping {
	const find = (pattern: RegExp) => columns.find((c) => pattern.test(c)) ?? '';
	const biomass = find(/od|biomass|dcw|cdw|\bx\b/i) || (columns[1] ?? '');
	return {
		time: find(/time|hour|^t\b|\(h\)/i) || (columns[0] ?? ''),
		biomass,
		biomassUnit: /od/i.test(biomass) ? 'od' : 'gPerL',
		gPerLPerOd: '0.4',
		substrate: find(/substrate|glucose|glc|sugar|^s\b/i),
		dissolvedOxygen: find(/\bdo\b|oxygen|dissolved|po2/i)
	};
}

export interface RowVerdict {
	line: number;
	cells: Record<string, string>;
	problems: string[];
}

export interface CheckedRunData {
	mappingErrors: Partial<Record<keyof ColumnMapping, string>>;
	verdicts: RowVerdict[];
	/** the accepted rows, in file order */
	series: {
		timeH: number[];
		biomassGPerL: number[];
		substrateGPerL?: number[];
		dissolvedOxygenMgPerL?: number[];
	};
	/** file line of each accepted row, so an error about point i can name its line */
	lines: number[];
	rejectedCount: number;
}

function readCell(
	label: string,
	text: string | undefined,
	problems: string[],
	{ positive = false } = {}
): number | null {
	const raw = (text ?? '').trim();
	if (raw === '') {
		problems.push(`${label} is missing`);
		return null;
	}
	const value = readNumberText(raw);
	if (value === null) {
		problems.push(`${label} “${raw}” is not a number`);
		return null;
	}
	if (value < 0) {
		problems.push(`${label} is negative (${value})`);
		return null;
	}
	if (positive && value === 0) {
		problems.push(`${label} is 0; it must be above 0 to take its logarithm`);
		return null;
	}
	return value;
}

/** Applies the mapping row by row; a bad row is excluded and says why, the rest go on. */
export function checkRunData(table: RunDataTable, mapping: ColumnMapping): CheckedRunData {
	const mappingErrors: CheckedRunData['mappingErrors'] = {};
	const index = (name: string) => table.columns.indexOf(name);
	if (index(mapping.time) < 0) mappingErrors.time = 'Choose the column that holds time in hours.';
	if (index(mapping.biomass) < 0) mappingErrors.biomass = 'Choose the column that holds biomass.';
	if (mapping.biomass && mapping.biomass === mapping.time)
		mappingErrors.biomass = 'Biomass and time cannot be the same column.';
	let factor = 1;
	if (mapping.biomassUnit === 'od') {
		const f = readNumberText(mapping.gPerLPerOd);
		if (f === null || f <= 0)
			mappingErrors.gPerLPerOd = 'Give the conversion as a number above 0 (g/L per OD unit).';
		else factor = f;
	}
	const series: CheckedRunData['series'] = { timeH: [], biomassGPerL: [] };
	if (mapping.substrate) series.substrateGPerL = [];
	if (mapping.dissolvedOxygen) series.dissolvedOxygenMgPerL = [];
	const result: CheckedRunData = {
		mappingErrors,
		verdicts: [],
		series,
		lines: [],
		rejectedCount: 0
	};
	if (Object.keys(mappingErrors).length) return result;

	const at = (cells: string[], name: string) => cells[index(name)];
	let lastTimeH: number | null = null;
	for (const { line, cells } of table.rows) {
		const problems: string[] = [];
		if (cells.length !== table.columns.length) {
			problems.push(`has ${cells.length} fields where the header has ${table.columns.length}`);
		}
		const t = readCell('time', at(cells, mapping.time), problems);
		if (t !== null && lastTimeH !== null && t <= lastTimeH)
			problems.push(`time ${t} h does not come after ${lastTimeH} h`);
		const x = readCell('biomass', at(cells, mapping.biomass), problems, { positive: true });
		const s = mapping.substrate
			? readCell('substrate', at(cells, mapping.substrate), problems)
			: null;
		const c = mapping.dissolvedOxygen
			? readCell('DO', at(cells, mapping.dissolvedOxygen), problems)
			: null;
		const shown: Record<string, string> = {};
		table.columns.forEach((name, i) => (shown[name] = cells[i] ?? ''));
		result.verdicts.push({ line, cells: shown, problems });
		if (problems.length) {
			result.rejectedCount++;
			continue;
		}
		lastTimeH = t;
		series.timeH.push(t!);
		series.biomassGPerL.push(x! * factor);
		series.substrateGPerL?.push(s!);
		series.dissolvedOxygenMgPerL?.push(c!);
		result.lines.push(line);
	}
	return result;
}

const FIT_SERIES_COLUMNS: Record<string, string> = {
	timeH: 'time',
	biomassGPerL: 'biomass',
	substrateGPerL: 'substrate',
	dissolvedOxygenMgPerL: 'dissolved oxygen'
};

/**
 * Turns a fit error's field into words from the file: about point i (`biomassGPerL.3`), the line it
 * came from; about a whole series (`biomassGPerL`), its column.
 */
export function describeFitFieldPath(path: string, lines: number[]): string | null {
	const match = /^(\w+)\.(\d+)$/.exec(path);
	if (!match) return FIT_SERIES_COLUMNS[path] ? `the ${FIT_SERIES_COLUMNS[path]} column` : null;
	const line = lines[Number(match[2])];
	return line === undefined ? null : `line ${line} of the file`;
}
