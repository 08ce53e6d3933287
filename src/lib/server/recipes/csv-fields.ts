// A version's own fields (pH, osmolality range, temperature, shelf life, storage, instructions)
// travel in the lines CSV as "# key: value" lines above the header, so a spreadsheet opens the
// table as it is and the file still round-trips. Text values are JSON strings: that keeps line
// breaks and quotes of the instructions intact on one line.
import { DRAFT_FIELD_LABELS, type DraftFieldsInput } from '$lib/recipes';
import { storedNumberText } from '$lib/number-reading';
import type { CheckedFields } from './draft';

type CarriedField = Exclude<keyof DraftFieldsInput, 'changeNote'>;

/** The CSV key of each carried field, in the order they are written. */
export const VERSION_CSV_KEYS: Record<CarriedField, string> = {
	targetPh: 'target_ph',
	osmolalityMinMOsmPerKg: 'osmolality_min_mosm_per_kg',
	osmolalityMaxMOsmPerKg: 'osmolality_max_mosm_per_kg',
	preparationTemperatureC: 'preparation_temperature_c',
	shelfLifeDays: 'shelf_life_days',
	storage: 'storage',
	instructions: 'instructions'
};

const TEXT_FIELDS = new Set<CarriedField>(['storage', 'instructions']);
const FIELD_OF_KEY = new Map(
	Object.entries(VERSION_CSV_KEYS).map(([field, key]) => [key, field as CarriedField])
);
const FIELD_LINE = /^#\s*([a-z_]+)\s*:\s?(.*)$/;

/** The comment lines that carry the version's fields; an empty field is left out. */
export function versionFieldComments(fields: CheckedFields): string[] {
	return (Object.keys(VERSION_CSV_KEYS) as CarriedField[]).flatMap((field) => {
		const value = fields[field];
		if (value === null || value === '') return [];
		const text =
			typeof value === 'number' ? storedNumberText(value) : JSON.stringify(String(value));
		return [`${VERSION_CSV_KEYS[field]}: ${text}`];
	});
}

export interface FileFields {
	/** The fields the file sets, as the editor would hold them. */
	fields: Partial<Record<CarriedField, string>>;
	/** Comment lines that name a field but cannot be read, each in words. */
	problems: string[];
}

function readValue(field: CarriedField, raw: string): { ok: true; text: string } | { ok: false } {
	const value = raw.trim();
	if (!TEXT_FIELDS.has(field) || !value.startsWith('"')) return { ok: true, text: value };
	try {
		const parsed: unknown = JSON.parse(value);
		return typeof parsed === 'string' ? { ok: true, text: parsed } : { ok: false };
	} catch {
		return { ok: false };
	}
}

/** The version fields a CSV's comment lines set; other comment lines are notes and are skipped. */
export function readVersionFieldComments(csvText: string): FileFields {
	const result: FileFields = { fields: {}, problems: [] };
	for (const line of csvText.replace(/^\uFEFF/, '').split(/\r?\n/)) {
		if (!line.startsWith('#')) continue;
		const match = FIELD_LINE.exec(line.trim());
		const field = match ? FIELD_OF_KEY.get(match[1]) : undefined;
		if (!match || !field) continue;
		const label = DRAFT_FIELD_LABELS[field];
		if (field in result.fields) {
			result.problems.push(`${label} (${match[1]}) is given twice; keep one line.`);
			continue;
		}
		const read = readValue(field, match[2]);
		if (read.ok) result.fields[field] = read.text;
		else
			result.problems.push(
				`${label} (${match[1]}): the text is not closed properly; write it in double quotes, with \\" for a quote and \\n for a new line.`
			);
	}
	return result;
}
