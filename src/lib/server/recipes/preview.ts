import type { z } from 'zod';
import type { FieldErrors } from '../forms';
import { RuleError } from '../rule-error';
import type { previewRequest } from '../api/operations/recipes';
import { analyseLines, type RecipeAnalysis } from './analysis';
import { checkFields, checkLines, normaliseLineInput } from './draft';

/** Line problems, each at its path, for the editor to show beside the line. */
export class DraftProblems extends Error {
	constructor(readonly fieldErrors: FieldErrors) {
		const count = Object.keys(fieldErrors).length;
		super(
			`${count} input${count === 1 ? ' needs' : 's need'} attention: ${Object.values(fieldErrors).flat().join(' ')}`
		);
	}
}

function text(value: number | string | undefined): string {
	return value === undefined ? '' : String(value);
}

/** A line problem of a line left out of the analysis, at its path among the lines sent. */
export interface LeftOutProblem {
	path: string;
	message: string;
}

export type PreviewAnalysis = RecipeAnalysis & { leftOut: LeftOutProblem[] };

/** Line indexes in the analysis are of the lines analysed; the editor's are of the lines sent. */
function toSentIndexes(analysis: RecipeAnalysis, sentIndexOf: number[]): RecipeAnalysis {
	const remap = (lines: number[]) => lines.map((i) => sentIndexOf[i] ?? i);
	return {
		...analysis,
		components: analysis.components.map((c) => ({ ...c, lines: remap(c.lines) })),
		warnings: analysis.warnings.map((w) => ({ ...w, lines: remap(w.lines) }))
	};
}

/**
 * The composition of lines as typed in the editor; nothing is stored. Lines that cannot be read are
 * left out and named in `leftOut`, so the analysis of the others goes on while one is being typed;
 * a problem with the recipe's own fields, or no line left to analyse, is refused as before.
 */
export function previewDraft(body: z.infer<typeof previewRequest>): PreviewAnalysis {
	const errors: FieldErrors = {};
	const fields = checkFields(
		{
			targetPh: '',
			osmolalityMinMOsmPerKg: text(body.osmolalityMinMOsmPerKg),
			osmolalityMaxMOsmPerKg: text(body.osmolalityMaxMOsmPerKg),
			preparationTemperatureC: text(body.preparationTemperatureC),
			shelfLifeDays: '',
			storage: '',
			instructions: '',
			changeNote: ''
		},
		errors
	);
	const lines = checkLines(body.lines.map(normaliseLineInput), body.recipeId ?? null, errors);
	const lineProblem = (path: string) => /^lines\.\d+\./.test(path);
	const fieldProblems = Object.keys(errors).filter((path) => !lineProblem(path));
	if (fieldProblems.length || lines.length === 0) throw new DraftProblems(errors);
	const sentIndexOf = lines.map((l) => l.position - 1);
	try {
		const analysis = analyseLines(lines, {
			temperatureC: fields.preparationTemperatureC,
			osmolalityMinMOsmPerKg: fields.osmolalityMinMOsmPerKg,
			osmolalityMaxMOsmPerKg: fields.osmolalityMaxMOsmPerKg,
			recipeId: body.recipeId ?? null
		});
		return {
			...toSentIndexes(analysis, sentIndexOf),
			leftOut: Object.entries(errors).flatMap(([path, messages]) =>
				messages.map((message) => ({ path, message }))
			)
		};
	} catch (cause) {
		if (cause instanceof RuleError && cause.field) {
			const field = cause.field.replace(
				/^lines\.(\d+)/,
				(_m, i: string) => `lines.${sentIndexOf[Number(i)] ?? i}`
			);
			throw new DraftProblems({ ...errors, [field]: [cause.message] });
		}
		throw cause;
	}
}
