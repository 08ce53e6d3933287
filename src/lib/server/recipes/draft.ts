import { readDecimalText } from '$lib/quantities';
import { eq } from 'drizzle-orm';
import { ChemistryInputError, isMolarUnit, normalizeConcentrationUnit } from '$chemistry';
import {
	DEFAULT_TOLERANCE_PERCENT,
	LINE_KINDS,
	STOCK_DOSE_UNIT,
	type DraftFieldsInput,
	type DraftLineInput,
	type LineKind
} from '$lib/recipes';
import { db, type Db } from '../db';
import { recipe, type Component } from '../db/schema';
import type { FieldErrors } from '../forms';
import { findComponentsByIds, molarMassOfComponent } from '../components/library';

export interface CheckedLine {
	position: number;
	kind: LineKind;
	componentId: string | null;
	shelfFormId: string | null;
	stockRecipeId: string | null;
	amount: number;
	unit: string;
	tolerancePercent: number;
	note: string;
}

export interface CheckedFields {
	targetPh: number | null;
	osmolalityMinMOsmPerKg: number | null;
	osmolalityMaxMOsmPerKg: number | null;
	preparationTemperatureC: number;
	shelfLifeDays: number | null;
	storage: string;
	instructions: string;
	changeNote: string;
}

export interface DraftInput {
	fields: DraftFieldsInput;
	lines: DraftLineInput[];
}

export type Checked<T> = { ok: true; value: T } | { ok: false; fieldErrors: FieldErrors };

type Reader = Pick<Db, 'select'>;

export const MAX_LINES = 200;

const FIELD_KEYS: (keyof DraftFieldsInput)[] = [
	'targetPh',
	'osmolalityMinMOsmPerKg',
	'osmolalityMaxMOsmPerKg',
	'preparationTemperatureC',
	'shelfLifeDays',
	'storage',
	'instructions',
	'changeNote'
];
const LINE_KEYS: (keyof DraftLineInput)[] = [
	'kind',
	'componentId',
	'shelfFormId',
	'stockRecipeId',
	'amount',
	'unit',
	'tolerancePercent',
	'note'
];

function text(value: unknown): string {
	return typeof value === 'string' ? value : typeof value === 'number' ? String(value) : '';
}

/** Reads the editor's form: recipe fields by name, lines as `lines.<i>.<field>`, in index order. */
export function readDraftForm(formData: FormData): DraftInput {
	const fields = Object.fromEntries(
		FIELD_KEYS.map((k) => [k, text(formData.get(k))])
	) as unknown as DraftFieldsInput;
	const byIndex = new Map<number, Partial<DraftLineInput>>();
	for (const [key, value] of formData.entries()) {
		const match = /^lines\.(\d{1,4})\.(\w+)$/.exec(key);
		if (!match || !(LINE_KEYS as string[]).includes(match[2])) continue;
		const index = Number(match[1]);
		const line = byIndex.get(index) ?? {};
		line[match[2] as keyof DraftLineInput] = text(value) as never;
		byIndex.set(index, line);
	}
	const lines = [...byIndex.entries()]
		.sort((a, b) => a[0] - b[0])
		.map(([, l]) => normaliseLineInput(l));
	return { fields, lines };
}

/** Any loosely shaped line (JSON, CSV, form) as the editor's text line. */
export function normaliseLineInput(
	line: Partial<Record<keyof DraftLineInput, unknown>>
): DraftLineInput {
	const kind = text(line.kind) === 'stock' ? 'stock' : text(line.kind) || 'component';
	return {
		kind: kind as LineKind,
		componentId: text(line.componentId).trim(),
		shelfFormId: text(line.shelfFormId).trim(),
		stockRecipeId: text(line.stockRecipeId).trim(),
		amount: text(line.amount).trim(),
		unit: text(line.unit).trim(),
		tolerancePercent: text(line.tolerancePercent).trim(),
		note: text(line.note)
	};
}

function parseNumber(raw: string): number | null {
	const read = readDecimalText(raw, 'Number');
	return read.ok ? read.value : null;
}

function optionalNumberField(
	raw: string,
	field: string,
	errors: FieldErrors,
	range: { min: number; max: number; what: string; integer?: boolean }
): number | null {
	if (!raw.trim()) return null;
	const value = parseNumber(raw);
	if (value === null) errors[field] = [`${range.what}: “${raw.trim()}” is not a number.`];
	else if (value < range.min || value > range.max)
		errors[field] = [`${range.what} is between ${range.min} and ${range.max}, not ${value}.`];
	else if (range.integer && !Number.isInteger(value))
		errors[field] = [`${range.what} is a whole number.`];
	else return value;
	return null;
}

export function checkFields(input: DraftFieldsInput, errors: FieldErrors): CheckedFields {
	const targetPh = optionalNumberField(input.targetPh, 'targetPh', errors, {
		min: 0,
		max: 14,
		what: 'Target pH'
	});
	const min = optionalNumberField(input.osmolalityMinMOsmPerKg, 'osmolalityMinMOsmPerKg', errors, {
		min: 0,
		max: 10000,
		what: 'Lowest osmolality'
	});
	const max = optionalNumberField(input.osmolalityMaxMOsmPerKg, 'osmolalityMaxMOsmPerKg', errors, {
		min: 0,
		max: 10000,
		what: 'Highest osmolality'
	});
	if (min !== null && max !== null && min > max) {
		errors.osmolalityMaxMOsmPerKg = [`The range runs from low to high: ${max} is below ${min}.`];
	}
	const temperature = input.preparationTemperatureC.trim()
		? optionalNumberField(input.preparationTemperatureC, 'preparationTemperatureC', errors, {
				min: -10,
				max: 100,
				what: 'Preparation temperature'
			})
		: 25;
	const shelfLifeDays = optionalNumberField(input.shelfLifeDays, 'shelfLifeDays', errors, {
		min: 0,
		max: 3650,
		what: 'Shelf life',
		integer: true
	});
	if (input.storage.length > 300) errors.storage = ['Keep storage to 300 characters.'];
	if (input.instructions.length > 20000)
		errors.instructions = ['Keep instructions to 20 000 characters.'];
	if (input.changeNote.length > 1000)
		errors.changeNote = ['Keep the change note to 1 000 characters.'];
	return {
		targetPh,
		osmolalityMinMOsmPerKg: min,
		osmolalityMaxMOsmPerKg: max,
		preparationTemperatureC: temperature ?? 25,
		shelfLifeDays,
		storage: input.storage.trim(),
		instructions: input.instructions.trim(),
		changeNote: input.changeNote.trim()
	};
}

/** Records a problem of one line's field; returns null so a check can end an expression. */
type LineProblem = (field: string, message: string) => null;

/** Kind, amount, tolerance and note: what every line has. */
function checkLineBasics(
	line: DraftLineInput,
	i: number,
	at: LineProblem
): { amount: number | null; tolerance: number } {
	if (!(LINE_KINDS as readonly string[]).includes(line.kind))
		at('kind', `Line ${i + 1}: the kind is “component” or “stock”.`);
	const amount = parseNumber(line.amount);
	if (!line.amount.trim()) at('amount', `Line ${i + 1}: give an amount.`);
	else if (amount === null) at('amount', `Line ${i + 1}: “${line.amount}” is not a number.`);
	else if (amount <= 0)
		at('amount', `Line ${i + 1}: the amount must be greater than zero, not ${amount}.`);
	let tolerance = DEFAULT_TOLERANCE_PERCENT;
	if (line.tolerancePercent.trim()) {
		const t = parseNumber(line.tolerancePercent);
		if (t === null || t <= 0 || t > 50)
			at(
				'tolerancePercent',
				`Line ${i + 1}: the weighing tolerance is a percentage above 0 and up to 50.`
			);
		else tolerance = t;
	}
	if (line.note.length > 500) at('note', `Line ${i + 1}: keep the note to 500 characters.`);
	return { amount, tolerance };
}

/** A stock line: an existing stock solution, not the recipe itself, once per recipe, dosed in mL/L. */
function checkStockLine(
	line: DraftLineInput,
	i: number,
	amount: number | null,
	at: LineProblem,
	context: { recipeId: string | null; firstStockLine: Map<string, number>; reader: Reader }
): void {
	const { recipeId, firstStockLine, reader } = context;
	const unit = line.unit.trim();
	if (!line.stockRecipeId) at('stockRecipeId', `Line ${i + 1}: choose the stock solution to add.`);
	else {
		const stock = reader.select().from(recipe).where(eq(recipe.id, line.stockRecipeId)).get();
		if (!stock) at('stockRecipeId', `Line ${i + 1}: no recipe with id “${line.stockRecipeId}”.`);
		else if (stock.kind !== 'stock_solution')
			at('stockRecipeId', `Line ${i + 1}: ${stock.name} is not a stock solution.`);
		else if (stock.id === recipeId)
			at('stockRecipeId', `Line ${i + 1}: a recipe cannot contain itself.`);
		else if (firstStockLine.has(stock.id)) {
			at(
				'stockRecipeId',
				`Line ${i + 1}: ${stock.name} is already on line ${firstStockLine.get(stock.id)! + 1}; combine the two lines.`
			);
		} else firstStockLine.set(stock.id, i);
	}
	if (unit !== STOCK_DOSE_UNIT)
		at(
			'unit',
			`Line ${i + 1}: a stock is dosed in ${STOCK_DOSE_UNIT} (millilitres of stock per litre of medium), not “${unit}”.`
		);
	else if (amount !== null && amount > 1000)
		at('amount', `Line ${i + 1}: at most 1000 mL of stock fit in a litre of medium.`);
}

/**
 * A component line: a library component, once per recipe, in a known concentration unit (molar only
 * with a molar mass), weighed as itself or one of its forms. Returns the unit in its usual spelling.
 */
function checkComponentLine(
	line: DraftLineInput,
	i: number,
	at: LineProblem,
	context: { components: Map<string, Component>; firstComponentLine: Map<string, number> }
): string {
	const { components, firstComponentLine } = context;
	let unit = line.unit.trim();
	const component = line.componentId ? components.get(line.componentId) : undefined;
	if (!line.componentId) at('componentId', `Line ${i + 1}: choose a component.`);
	else if (!component)
		at('componentId', `Line ${i + 1}: no component “${line.componentId}” in the library.`);
	else if (firstComponentLine.has(component.id)) {
		at(
			'componentId',
			`Line ${i + 1}: ${component.name} is already on line ${firstComponentLine.get(component.id)! + 1}; combine the two lines.`
		);
	} else firstComponentLine.set(component.id, i);
	try {
		unit = normalizeConcentrationUnit(unit, 'unit');
		if (component && isMolarUnit(unit as never) && molarMassOfComponent(component) === null) {
			at(
				'unit',
				`Line ${i + 1}: ${component.name} has no formula or molar mass, so give it in a mass unit such as g/L.`
			);
		}
	} catch (cause) {
		if (!(cause instanceof ChemistryInputError)) throw cause;
		at('unit', `Line ${i + 1}: ${cause.message}.`);
	}
	if (line.shelfFormId && component) {
		const shelf = components.get(line.shelfFormId);
		if (!shelf) at('shelfFormId', `Line ${i + 1}: no component “${line.shelfFormId}” to weigh.`);
		else if (shelf.id !== component.id && shelf.basisComponentId !== component.id) {
			at('shelfFormId', `Line ${i + 1}: ${shelf.name} is not a form of ${component.name}.`);
		}
	}
	return unit;
}

/**
 * Checks every line and reports each problem at `lines.<i>.<field>`, all at once, so the editor can
 * show them beside the lines. `recipeId` is the recipe being edited (it cannot dose itself).
 */
export function checkLines(
	lines: DraftLineInput[],
	recipeId: string | null,
	errors: FieldErrors,
	reader: Reader = db
): CheckedLine[] {
	if (lines.length > MAX_LINES) {
		errors.lines = [`A recipe has at most ${MAX_LINES} lines; this one has ${lines.length}.`];
		return [];
	}
	const components = findComponentsByIds(
		lines.flatMap((l) => [l.componentId, l.shelfFormId]),
		reader
	);
	const firstComponentLine = new Map<string, number>();
	const firstStockLine = new Map<string, number>();
	const checked: CheckedLine[] = [];

	lines.forEach((line, i) => {
		const at: LineProblem = (field, message) => (
			(errors[`lines.${i}.${field}`] ??= []).push(message),
			null
		);
		const before = Object.keys(errors).length;
		const { amount, tolerance } = checkLineBasics(line, i, at);
		let unit = line.unit.trim();
		if (line.kind === 'stock')
			checkStockLine(line, i, amount, at, { recipeId, firstStockLine, reader });
		else unit = checkComponentLine(line, i, at, { components, firstComponentLine });
		if (Object.keys(errors).length > before || amount === null) return;
		const isStock = line.kind === 'stock';
		checked.push({
			position: i + 1,
			kind: line.kind,
			componentId: isStock ? null : line.componentId,
			shelfFormId:
				isStock || !line.shelfFormId || line.shelfFormId === line.componentId
					? null
					: line.shelfFormId,
			stockRecipeId: isStock ? line.stockRecipeId : null,
			amount,
			unit,
			tolerancePercent: tolerance,
			note: line.note.trim()
		});
	});
	return checked;
}

export function checkDraft(
	input: DraftInput,
	recipeId: string | null,
	reader: Reader = db
): Checked<{ fields: CheckedFields; lines: CheckedLine[] }> {
	const errors: FieldErrors = {};
	const fields = checkFields(input.fields, errors);
	const lines = checkLines(input.lines, recipeId, errors, reader);
	if (Object.keys(errors).length) return { ok: false, fieldErrors: errors };
	return { ok: true, value: { fields, lines } };
}
