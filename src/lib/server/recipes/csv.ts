import { formatDateTime } from '$lib/date-time';
import { siteTimeZone } from '../site-time-zone';
import { eq, sql } from 'drizzle-orm';
import { VERSION_STATUS_LABELS, type DraftLineInput } from '$lib/recipes';
import { db } from '../db';
import { recipe, type Recipe, type RecipeVersion } from '../db/schema';
import { parseCsv, toCsv, type CsvRowResult } from '../csv';
import type { Actor } from '../audit';
import { RuleError } from '../rule-error';
import { findComponentByIdOrName } from '../components/library';
import { noComponentRefusals } from '../components/component-suggestions';
import { checkLines, type CheckedLine } from './draft';
import { appendLines } from './drafts';
import { toDraftLines } from './editor-data';
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

export interface LineImportPreview {
	rows: CsvRowResult<Omit<CheckedLine, 'position'>>[];
	errorCount: number;
}

/**
 * Checks CSV rows as lines appended to the draft: names resolve to components and stocks, and a
 * component already in the draft (or on an earlier row) is a duplicate. Writes nothing.
 */
export function previewLineCsv(version: RecipeVersion, text: string): LineImportPreview {
	const table = parseCsv(text, LINE_CSV_COLUMNS);
	if (table.rows.length === 0)
		throw new RuleError('The CSV has a header but no rows.', { field: 'csv' });
	const existing = toDraftLines(linesOf(version.id));
	const nameErrors = new Map<number, string[]>();
	const refuseUnknown = noComponentRefusals();
	const incoming: DraftLineInput[] = table.rows.map(({ values }, i) => {
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
	return { rows, errorCount: rows.filter((r) => r.errors.length).length };
}

/** All rows or none. Returns how many lines were added. */
export function importLineCsv(actor: Actor, version: RecipeVersion, text: string): number {
	if (version.status !== 'draft')
		throw new RuleError(
			`Version ${version.n} is not a draft; lines can only be imported into a draft.`,
			{ status: 409 }
		);
	const preview = previewLineCsv(version, text);
	if (preview.errorCount) {
		throw new RuleError(
			`${preview.errorCount} row${preview.errorCount === 1 ? ' has' : 's have'} problems; nothing was imported. Fix them and preview again.`,
			{ field: 'csv' }
		);
	}
	appendLines(
		actor,
		version.id,
		preview.rows.map((r) => r.value!)
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
			`Lines in order of addition; amounts are concentrations in the finished medium, stocks in mL per L. Exported ${formatDateTime(new Date(), siteTimeZone())}`
		]
	);
}
