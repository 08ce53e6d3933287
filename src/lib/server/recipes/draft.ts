import { eq } from 'drizzle-orm';
import { isMolarUnit } from '$chemistry';
import type { DraftFieldsInput, DraftLineInput, LineKind } from '$lib/recipes';
import {
	DEFAULT_PREPARATION_TEMPERATURE_C,
	MAX_LINES,
	draftFieldErrors,
	draftFieldsSchema,
	draftFieldsText,
	draftLineSchema,
	draftLineText,
	draftLinesSchema,
	readConcentrationUnit,
	type DraftLine
} from '$lib/recipes/draft-schema';
import { db, type Db } from '../db';
import { recipe, type Component } from '../db/schema';
import type { FieldErrors } from '../forms';
import { findComponentsByIds, molarMassOfComponent } from '../components/library';
import { noComponentRefusals } from '../components/component-suggestions';

export { MAX_LINES };

export interface CheckedLine extends DraftLine {
	position: number;
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

const LINE_KEYS = Object.keys(draftLineText.shape);

/** Reads the editor's form: recipe fields by name, lines as `lines.<i>.<field>`, in index order. */
export function readDraftForm(formData: FormData): DraftInput {
	const fields = draftFieldsText.parse(
		Object.fromEntries(Object.keys(draftFieldsText.shape).map((k) => [k, formData.get(k)]))
	);
	const byIndex = new Map<number, Record<string, unknown>>();
	for (const [key, value] of formData.entries()) {
		const match = /^lines\.(\d{1,4})\.(\w+)$/.exec(key);
		if (!match || !LINE_KEYS.includes(match[2])) continue;
		const index = Number(match[1]);
		byIndex.set(index, { ...byIndex.get(index), [match[2]]: value });
	}
	const lines = [...byIndex.entries()]
		.sort((a, b) => a[0] - b[0])
		.map(([, line]) => normaliseLineInput(line));
	return { fields, lines };
}

/** Any loosely shaped line (JSON, CSV, form) as the editor's text line. */
export function normaliseLineInput(
	line: Partial<Record<keyof DraftLineInput, unknown>>
): DraftLineInput {
	return draftLineText.parse(line);
}

const UNCHECKED_FIELDS: CheckedFields = {
	targetPh: null,
	osmolalityMinMOsmPerKg: null,
	osmolalityMaxMOsmPerKg: null,
	preparationTemperatureC: DEFAULT_PREPARATION_TEMPERATURE_C,
	shelfLifeDays: null,
	storage: '',
	instructions: '',
	changeNote: ''
};

function addErrors(errors: FieldErrors, more: FieldErrors): void {
	for (const [key, messages] of Object.entries(more)) (errors[key] ??= []).push(...messages);
}

/** The recipe fields through the draft schema; when a problem is added, the value is not to be used. */
export function checkFields(input: DraftFieldsInput, errors: FieldErrors): CheckedFields {
	const read = draftFieldsSchema.safeParse(input);
	if (read.success) return read.data;
	addErrors(errors, draftFieldErrors(read.error.issues, 'fields'));
	return UNCHECKED_FIELDS;
}

/** Records a problem of one line's field. */
type LineProblem = (field: string, message: string) => void;

/** A stock line's lookup: an existing stock solution, not the recipe itself, once per recipe. */
function lookUpStock(
	line: DraftLineInput,
	i: number,
	at: LineProblem,
	context: { recipeId: string | null; firstStockLine: Map<string, number>; reader: Reader }
): void {
	const { recipeId, firstStockLine, reader } = context;
	if (!line.stockRecipeId) return;
	const stock = reader.select().from(recipe).where(eq(recipe.id, line.stockRecipeId)).get();
	if (!stock) at('stockRecipeId', `no recipe with id “${line.stockRecipeId}”.`);
	else if (stock.kind !== 'stock_solution')
		at('stockRecipeId', `${stock.name} is not a stock solution.`);
	else if (stock.id === recipeId) at('stockRecipeId', 'a recipe cannot contain itself.');
	else if (firstStockLine.has(stock.id)) {
		at(
			'stockRecipeId',
			`${stock.name} is already on line ${firstStockLine.get(stock.id)! + 1}; combine the two lines.`
		);
	} else firstStockLine.set(stock.id, i);
}

/**
 * A component line's lookups: a library component, once per recipe, molar only with a molar mass,
 * weighed as itself or one of its forms.
 */
function lookUpComponent(
	line: DraftLineInput,
	i: number,
	at: LineProblem,
	context: {
		components: Map<string, Component>;
		firstComponentLine: Map<string, number>;
		refuseUnknown: (text: string) => string;
	}
): void {
	const { components, firstComponentLine, refuseUnknown } = context;
	if (!line.componentId) return;
	const component = components.get(line.componentId);
	if (!component) {
		at('componentId', refuseUnknown(line.componentId));
		return;
	}
	if (firstComponentLine.has(component.id)) {
		at(
			'componentId',
			`${component.name} is already on line ${firstComponentLine.get(component.id)! + 1}; combine the two lines.`
		);
	} else firstComponentLine.set(component.id, i);
	const unit = readConcentrationUnit(line.unit);
	if (unit.ok && isMolarUnit(unit.unit as never) && molarMassOfComponent(component) === null) {
		at(
			'unit',
			`${component.name} has no formula or molar mass, so give it in a mass unit such as g/L.`
		);
	}
	if (line.shelfFormId) {
		const shelf = components.get(line.shelfFormId);
		if (!shelf) at('shelfFormId', `no component “${line.shelfFormId}” to weigh.`);
		else if (shelf.id !== component.id && shelf.basisComponentId !== component.id) {
			at('shelfFormId', `${shelf.name} is not a form of ${component.name}.`);
		}
	}
}

/** Each line through the draft schema on its own, so the lines that pass keep their values. */
function readLines(lines: DraftLineInput[], errors: FieldErrors): (DraftLine | null)[] {
	return lines.map((line, i) => {
		const read = draftLineSchema.safeParse(line);
		if (read.success) return read.data;
		const issues = read.error.issues.map((issue) => ({ ...issue, path: [i, ...issue.path] }));
		addErrors(errors, draftFieldErrors(issues, 'lines'));
		return null;
	});
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
	const all = draftLinesSchema.safeParse(lines);
	const tooMany = all.success ? undefined : all.error.issues.find((i) => !i.path.length);
	if (tooMany) {
		errors.lines = [tooMany.message];
		return [];
	}
	const read = all.success ? all.data : readLines(lines, errors);
	const components = findComponentsByIds(
		lines.flatMap((l) => [l.componentId, l.shelfFormId]),
		reader
	);
	const firstComponentLine = new Map<string, number>();
	const firstStockLine = new Map<string, number>();
	const refuseUnknown = noComponentRefusals(reader);
	const checked: CheckedLine[] = [];
	lines.forEach((line, i) => {
		let lookedUp = true;
		const at: LineProblem = (field, message) => {
			lookedUp = false;
			(errors[`lines.${i}.${field}`] ??= []).push(`Line ${i + 1}: ${message}`);
		};
		if (line.kind === 'stock') lookUpStock(line, i, at, { recipeId, firstStockLine, reader });
		else if ((line.kind as LineKind) === 'component')
			lookUpComponent(line, i, at, { components, firstComponentLine, refuseUnknown });
		const value = read[i];
		if (value && lookedUp) checked.push({ position: i + 1, ...value });
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
