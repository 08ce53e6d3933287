import { formatDateTime } from '$lib/date-time';
import { siteTimeZone } from '../site-time-zone';
import { eq, sql } from 'drizzle-orm';
import { DRAFT_FIELD_LABELS, VERSION_STATUS_LABELS, type DraftLineInput } from '$lib/recipes';
import { db } from '../db';
import { recipe, type Recipe, type RecipeVersion } from '../db/schema';
import { parseCsv, toCsv, type CsvRowResult } from '../csv';
import type { Actor } from '../audit';
import { RuleError } from '../rule-error';
import { findComponentByIdOrName } from '../components/library';
import { noComponentRefusals } from '../components/component-suggestions';
import { checkFields, checkLines, type CheckedFields, type CheckedLine } from './draft';
import { readVersionFieldComments, versionFieldComments } from './csv-fields';
import { appendLines, fieldsOf, saveDraft } from './drafts';
import { toDraftFields, toDraftLines } from './editor-data';
import { describedLinesOf, linesOf } from './queries';

export const LINE_CSV_COLUMNS = {
	required: ['component', 'amount', 'unit'],
	allowed: [
		'kind',
		'component',
		'shelf_form',
		'stock',
		'amount',
		'unit',
		'tolerance_percent',
		'note'
	]
} as const;

const COLUMN_OF_FIELD: Record<string, string> = {
	kind: 'kind',
	componentId: 'component',
	shelfFormId: 'shelf_form',
	stockRecipeId: 'stock',
	amount: 'amount',
	unit: 'unit',
	tolerancePercent: 'tolerance_percent',
	note: 'note'
};

function findRecipeByIdOrName(text: string): Recipe | undefined {
	if (!text) return undefined;
	return (
		db.select().from(recipe).where(eq(recipe.id, text)).get() ??
		db
			.select()
			.from(recipe)
			.where(sql`lower(${recipe.name}) = lower(${text})`)
			.get()
	);
}

/** Replace: the file's lines and fields become the draft's. Append: its lines go after the draft's. */
export const LINE_IMPORT_MODES = ['replace', 'append'] as const;
export type LineImportMode = (typeof LINE_IMPORT_MODES)[number];

export function readImportMode(value: FormDataEntryValue | null): LineImportMode {
	if (value === 'replace' || value === 'append') return value;
	throw new RuleError('Choose whether the file replaces the draft’s lines or adds to them.', {
		field: 'mode'
	});
}

export interface FieldChange {
	label: string;
	from: string;
	to: string;
}

export interface LineImportPreview {
	mode: LineImportMode;
	rows: CsvRowResult<Omit<CheckedLine, 'position'>>[];
	/** rows with problems, plus one when the file's version fields have problems */
	errorCount: number;
	/** lines of the draft the import removes (replace) or keeps before the new ones (append) */
	draftLineCount: number;
	/** replace: the version fields the file changes; append never changes them */
	fieldChanges: FieldChange[];
	/** version fields the file gives, in append mode left as the draft has them */
	fieldsLeftAlone: string[];
	fieldProblems: string[];
}

interface CheckedImport {
	preview: LineImportPreview;
	fields: CheckedFields;
}

function incomingLines(table: ReturnType<typeof parseCsv>, nameErrors: Map<number, string[]>) {
	const refuseUnknown = noComponentRefusals();
	return table.rows.map(({ values }, i): DraftLineInput => {
		const kind = (
			values.kind || (values.stock && !values.component ? 'stock' : 'component')
		).toLowerCase();
		const problems: string[] = [];
		let componentId = '';
		let shelfFormId = '';
		let stockRecipeId = '';
		if (kind === 'stock') {
			const stock = findRecipeByIdOrName(values.stock || values.component);
			if (!stock) problems.push(`stock: no recipe “${values.stock || values.component}”.`);
			else stockRecipeId = stock.id;
		} else {
			const found = findComponentByIdOrName(values.component);
			if (!values.component) problems.push('component: give the component’s name or id.');
			else if (!found) problems.push(`component: ${refuseUnknown(values.component)}`);
			else componentId = found.id;
			if (values.shelf_form) {
				const shelf = findComponentByIdOrName(values.shelf_form);
				if (!shelf) problems.push(`shelf_form: ${refuseUnknown(values.shelf_form)}`);
				else shelfFormId = shelf.id;
			}
		}
		if (problems.length) nameErrors.set(i, problems);
		return {
			kind: kind as DraftLineInput['kind'],
			componentId,
			shelfFormId,
			stockRecipeId,
			amount: values.amount,
			unit: values.unit,
			tolerancePercent: values.tolerance_percent ?? '',
			note: values.note ?? ''
		};
	});
}

/** The draft's fields with the file's over them, checked by the editor's own rules. */
function checkFileFields(version: RecipeVersion, text: string, mode: LineImportMode) {
	const file = readVersionFieldComments(text);
	const current = toDraftFields(fieldsOf(version));
	const given = Object.keys(file.fields) as (keyof typeof file.fields)[];
	if (mode === 'append')
		return {
			fields: fieldsOf(version),
			changes: [],
			leftAlone: given.map((f) => DRAFT_FIELD_LABELS[f]),
			problems: file.problems
		};
	const errors: Record<string, string[]> = {};
	const fields = checkFields({ ...current, ...file.fields }, errors);
	const problems = [
		...file.problems,
		...Object.values(errors).flatMap((messages) => messages.map((m) => `Version fields: ${m}`))
	];
	const changes = given
		.filter((f) => file.fields[f] !== current[f])
		.map((f) => ({
			label: DRAFT_FIELD_LABELS[f],
			from: current[f] || '(empty)',
			to: file.fields[f] || '(empty)'
		}));
	return { fields, changes, leftAlone: [], problems };
}

function checkImport(version: RecipeVersion, text: string, mode: LineImportMode): CheckedImport {
	const table = parseCsv(text, LINE_CSV_COLUMNS);
	if (table.rows.length === 0)
		throw new RuleError('The CSV has a header but no rows.', { field: 'csv' });
	const draftLines = toDraftLines(linesOf(version.id));
	const existing = mode === 'append' ? draftLines : [];
	const nameErrors = new Map<number, string[]>();
	const incoming = incomingLines(table, nameErrors);
	const errors: Record<string, string[]> = {};
	const checked = checkLines([...existing, ...incoming], version.recipeId, errors);
	const byPosition = new Map(checked.map((c) => [c.position, c]));
	const rows = table.rows.map(({ rowNumber, values }, i) => {
		const index = existing.length + i;
		const rowErrors = [...(nameErrors.get(i) ?? [])];
		for (const [path, messages] of Object.entries(errors)) {
			const match = /^lines\.(\d+)\.(\w+)$/.exec(path);
			if (!match || Number(match[1]) !== index) continue;
			const column = COLUMN_OF_FIELD[match[2]] ?? match[2];
			// A name that did not resolve already says so; the empty-id message would only repeat it.
			if (nameErrors.has(i) && ['component', 'stock'].includes(column)) continue;
			rowErrors.push(...messages.map((m) => `${column}: ${m.replace(/^Line \d+: /, '')}`));
		}
		const line = byPosition.get(index + 1);
		return {
			rowNumber,
			values,
			errors: rowErrors,
			value: line && !rowErrors.length ? (({ position: _p, ...rest }) => rest)(line) : undefined
		};
	});
	const fileFields = checkFileFields(version, text, mode);
	const rowErrorCount = rows.filter((r) => r.errors.length).length;
	return {
		fields: fileFields.fields,
		preview: {
			mode,
			rows,
			errorCount: rowErrorCount + (fileFields.problems.length ? 1 : 0),
			draftLineCount: draftLines.length,
			fieldChanges: fileFields.changes,
			fieldsLeftAlone: fileFields.leftAlone,
			fieldProblems: fileFields.problems
		}
	};
}

/**
 * Checks CSV rows as the draft's new lines (replace) or as lines after the draft's (append): names
 * resolve to components and stocks, and a component twice is a duplicate. Writes nothing.
 */
export function previewLineCsv(
	version: RecipeVersion,
	text: string,
	mode: LineImportMode
): LineImportPreview {
	return checkImport(version, text, mode).preview;
}

/** All rows or none. Returns how many lines were imported. */
export function importLineCsv(
	actor: Actor,
	version: RecipeVersion,
	text: string,
	mode: LineImportMode
): number {
	if (version.status !== 'draft')
		throw new RuleError(
			`Version ${version.n} is not a draft; lines can only be imported into a draft.`,
			{ status: 409 }
		);
	const { preview, fields } = checkImport(version, text, mode);
	if (preview.errorCount) {
		throw new RuleError(
			`${preview.errorCount} row${preview.errorCount === 1 ? ' has' : 's have'} problems; nothing was imported. Fix them and preview again.`,
			{ field: 'csv' }
		);
	}
	const lines = preview.rows.map((r) => r.value!);
	if (mode === 'append') appendLines(actor, version.id, lines);
	else
		saveDraft(
			actor,
			version.id,
			version.revision,
			{ fields, lines: lines.map((l, i) => ({ ...l, position: i + 1 })) },
			'csv'
		);
	return preview.rows.length;
}

export function exportVersionCsv(recipeRow: Recipe, version: RecipeVersion): string {
	const rows = describedLinesOf(version.id).map((l) => ({
		kind: l.kind,
		component: l.kind === 'stock' ? '' : l.componentName,
		shelf_form: l.shelfFormName ?? '',
		stock: l.kind === 'stock' ? l.stockRecipeName : '',
		amount: l.amount,
		unit: l.unit,
		tolerance_percent: l.tolerancePercent,
		note: l.note
	}));
	return toCsv(
		rows,
		[...LINE_CSV_COLUMNS.allowed],
		[
			`Brothwright recipe: ${recipeRow.name}, version ${version.n} (${VERSION_STATUS_LABELS[version.status]})`,
			`Lines in order of addition; amounts are concentrations in the finished medium, stocks in mL per L. Exported ${formatDateTime(new Date(), siteTimeZone())}`,
			...versionFieldComments(fieldsOf(version))
		]
	);
}
