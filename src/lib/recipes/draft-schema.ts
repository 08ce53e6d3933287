// The shape of a recipe draft and every rule that needs no database, shared by server and browser.
// The server adds the lookups (components, shelf forms, stock recipes) in server/recipes/draft.ts.
import { z } from 'zod';
import { ChemistryInputError, normalizeConcentrationUnit } from '$chemistry';
import { readDecimalText } from '$lib/number-reading';
import {
	DEFAULT_TOLERANCE_PERCENT,
	DRAFT_FIELD_LABELS,
	LINE_KINDS,
	STOCK_DOSE_UNIT,
	type DraftFieldsInput,
	type DraftLineInput,
	type LineKind
} from '$lib/recipes';

export const MAX_LINES = 200;

/** Common practice when the recipe names no preparation temperature. */
export const DEFAULT_PREPARATION_TEMPERATURE_C = 25;

/** Any loose value (form text, JSON number, missing) as the text the editor would hold. */
function asText(value: unknown): string {
	return typeof value === 'string' ? value : typeof value === 'number' ? String(value) : '';
}

const looseText = z.preprocess(asText, z.string());
const trimmedText = z.preprocess((v) => asText(v).trim(), z.string());

/** One line as the editor holds it: every field as text, ids, amount and unit trimmed. */
export const draftLineText = z.object({
	kind: z.preprocess(
		(v) => (asText(v) === 'stock' ? 'stock' : asText(v) || 'component'),
		z.string()
	) as z.ZodType<LineKind>,
	componentId: trimmedText,
	shelfFormId: trimmedText,
	stockRecipeId: trimmedText,
	amount: trimmedText,
	unit: trimmedText,
	tolerancePercent: trimmedText,
	note: looseText
});

/** The recipe-level fields as the editor holds them. */
export const draftFieldsText = z.object({
	targetPh: looseText,
	osmolalityMinMOsmPerKg: looseText,
	osmolalityMaxMOsmPerKg: looseText,
	preparationTemperatureC: looseText,
	shelfLifeDays: looseText,
	storage: looseText,
	instructions: looseText,
	changeNote: looseText
});

interface Range {
	min: number;
	max: number;
	integer?: boolean;
}

/** An optional number typed as text, read by readDecimalText; blank is null. */
function optionalDecimal(field: keyof DraftFieldsInput, range: Range) {
	const label = DRAFT_FIELD_LABELS[field];
	return looseText.transform((raw, ctx): number | null => {
		if (!raw.trim()) return null;
		const read = readDecimalText(raw, label);
		let problem: string | null = null;
		if (!read.ok) problem = read.message;
		else if (read.value < range.min || read.value > range.max)
			problem = `${label} is between ${range.min} and ${range.max}, not ${read.value}.`;
		else if (range.integer && !Number.isInteger(read.value))
			problem = `${label} is a whole number.`;
		else return read.value;
		ctx.addIssue({ code: 'custom', message: problem });
		return z.NEVER;
	});
}

function limitedText(field: keyof DraftFieldsInput, maxLength: number, shown: string) {
	return looseText
		.refine(
			(t) => t.length <= maxLength,
			`Keep “${DRAFT_FIELD_LABELS[field]}” to ${shown} characters.`
		)
		.transform((t) => t.trim());
}

/** The recipe-level fields, checked: ranges, whole days, text lengths, osmolality low to high. */
export const draftFieldsSchema = z
	.object({
		targetPh: optionalDecimal('targetPh', { min: 0, max: 14 }),
		osmolalityMinMOsmPerKg: optionalDecimal('osmolalityMinMOsmPerKg', { min: 0, max: 10000 }),
		osmolalityMaxMOsmPerKg: optionalDecimal('osmolalityMaxMOsmPerKg', { min: 0, max: 10000 }),
		preparationTemperatureC: optionalDecimal('preparationTemperatureC', {
			min: -10,
			max: 100
		}).transform((t) => t ?? DEFAULT_PREPARATION_TEMPERATURE_C),
		shelfLifeDays: optionalDecimal('shelfLifeDays', { min: 0, max: 3650, integer: true }),
		storage: limitedText('storage', 300, '300'),
		instructions: limitedText('instructions', 20000, '20 000'),
		changeNote: limitedText('changeNote', 1000, '1 000')
	})
	.superRefine(
		(f, ctx) => {
			const low = f.osmolalityMinMOsmPerKg;
			const high = f.osmolalityMaxMOsmPerKg;
			if (typeof low === 'number' && typeof high === 'number' && low > high)
				ctx.addIssue({
					code: 'custom',
					path: ['osmolalityMaxMOsmPerKg'],
					message: `${DRAFT_FIELD_LABELS.osmolalityMaxMOsmPerKg}: the range runs from low to high: ${high} is below ${low}.`
				});
		},
		// Both ends are checked even when another field is refused, so every problem shows at once.
		{ when: () => true }
	);

export type DraftFields = z.output<typeof draftFieldsSchema>;

/** A component line's unit in its usual spelling, or the reason it is not a concentration unit. */
export function readConcentrationUnit(
	text: string
): { ok: true; unit: string } | { ok: false; message: string } {
	try {
		return { ok: true, unit: normalizeConcentrationUnit(text, 'unit') };
	} catch (cause) {
		if (!(cause instanceof ChemistryInputError)) throw cause;
		return { ok: false, message: `${cause.message}.` };
	}
}

function readAmount(raw: string): { value: number | null; problem: string | null } {
	if (!raw) return { value: null, problem: 'give an amount.' };
	const read = readDecimalText(raw, 'the amount');
	if (!read.ok) return { value: null, problem: read.message };
	if (read.value <= 0)
		return { value: null, problem: `the amount must be greater than zero, not ${read.value}.` };
	return { value: read.value, problem: null };
}

function readTolerance(raw: string): number | null {
	if (!raw) return DEFAULT_TOLERANCE_PERCENT;
	const read = readDecimalText(raw, 'tolerance');
	return read.ok && read.value > 0 && read.value <= 50 ? read.value : null;
}

/** A line's problems by field; each message names the field as the editor's label does ("amount"). */
function lineProblems(line: z.output<typeof draftLineText>): [keyof DraftLineInput, string][] {
	const problems: [keyof DraftLineInput, string][] = [];
	if (!(LINE_KINDS as readonly string[]).includes(line.kind))
		problems.push(['kind', 'the kind is “component” or “stock”.']);
	const amount = readAmount(line.amount);
	if (amount.problem) problems.push(['amount', amount.problem]);
	if (readTolerance(line.tolerancePercent) === null)
		problems.push([
			'tolerancePercent',
			'the weighing tolerance is a percentage above 0 and up to 50.'
		]);
	if (line.note.length > 500) problems.push(['note', 'keep the note to 500 characters.']);
	if (line.kind === 'stock') {
		if (!line.stockRecipeId) problems.push(['stockRecipeId', 'choose the stock solution to add.']);
		if (line.unit !== STOCK_DOSE_UNIT)
			problems.push([
				'unit',
				`the unit “${line.unit}” does not fit a stock line: a stock is dosed in ${STOCK_DOSE_UNIT} (millilitres of stock per litre of medium).`
			]);
		else if (amount.value !== null && amount.value > 1000)
			problems.push(['amount', 'at most 1000 mL of stock fit in a litre of medium.']);
	} else if (line.kind === 'component') {
		if (!line.componentId) problems.push(['componentId', 'choose a component.']);
		const unit = readConcentrationUnit(line.unit);
		if (!unit.ok) problems.push(['unit', unit.message]);
	}
	return problems;
}

/**
 * One line, checked: the amount and tolerance read as numbers, the unit fitting the line's kind. An
 * issue's message starts without the line; `draftFieldErrors` puts "Line <n>: " in front.
 */
export const draftLineSchema = draftLineText
	.superRefine((line, ctx) => {
		for (const [field, message] of lineProblems(line))
			ctx.addIssue({ code: 'custom', path: [field], message });
	})
	.transform((line) => {
		const isStock = line.kind === 'stock';
		const unit = isStock ? line.unit : readConcentrationUnit(line.unit);
		return {
			kind: line.kind,
			componentId: isStock ? null : line.componentId,
			shelfFormId:
				isStock || !line.shelfFormId || line.shelfFormId === line.componentId
					? null
					: line.shelfFormId,
			stockRecipeId: isStock ? line.stockRecipeId : null,
			amount: readAmount(line.amount).value as number,
			unit: typeof unit === 'string' ? unit : unit.ok ? unit.unit : line.unit,
			tolerancePercent: readTolerance(line.tolerancePercent) as number,
			note: line.note.trim()
		};
	});

export type DraftLine = z.output<typeof draftLineSchema>;

export const draftLinesSchema = z.array(draftLineSchema).max(MAX_LINES, {
	error: (issue) =>
		`A recipe has at most ${MAX_LINES} lines; this one has ${(issue.input as unknown[]).length}.`
});

/** A whole draft: the form, the API and the imports all read it through this. */
export const draftSchema = z.object({ fields: draftFieldsSchema, lines: draftLinesSchema });

/** The field key of an issue inside `draftSchema`, `draftFieldsSchema` or `draftLinesSchema`. */
export function draftFieldErrors(
	issues: readonly z.core.$ZodIssue[],
	within: 'draft' | 'fields' | 'lines' = 'draft'
): Record<string, string[]> {
	const errors: Record<string, string[]> = {};
	for (const issue of issues) {
		const path = issue.path.map(String);
		if (within === 'draft' && path[0] === 'fields') path.shift();
		if (within === 'lines') path.unshift('lines');
		const key = path.join('.') || 'form';
		const isLine = path[0] === 'lines' && path.length > 2;
		const message = isLine ? `Line ${Number(path[1]) + 1}: ${issue.message}` : issue.message;
		(errors[key] ??= []).push(message);
	}
	return errors;
}
