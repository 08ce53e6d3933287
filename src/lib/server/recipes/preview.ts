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

/** The composition of lines as typed in the editor; nothing is stored. */
export function previewDraft(body: z.infer<typeof previewRequest>): RecipeAnalysis {
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
	if (Object.keys(errors).length) throw new DraftProblems(errors);
	try {
		return analyseLines(lines, {
			temperatureC: fields.preparationTemperatureC,
			osmolalityMinMOsmPerKg: fields.osmolalityMinMOsmPerKg,
			osmolalityMaxMOsmPerKg: fields.osmolalityMaxMOsmPerKg,
			recipeId: body.recipeId ?? null
		});
	} catch (cause) {
		if (cause instanceof RuleError && cause.field)
			throw new DraftProblems({ [cause.field]: [cause.message] });
		throw cause;
	}
}
