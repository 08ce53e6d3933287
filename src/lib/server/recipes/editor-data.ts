import type { DraftFieldsInput, DraftLineInput, LineKind } from '$lib/recipes';
import type { CheckedFields } from './draft';

const text = (value: number | string | null | undefined) =>
	value === null || value === undefined ? '' : String(value);

/** Stored fields as the editor's text fields. */
export function toDraftFields(fields: CheckedFields): DraftFieldsInput {
	return {
		targetPh: text(fields.targetPh),
		osmolalityMinMOsmPerKg: text(fields.osmolalityMinMOsmPerKg),
		osmolalityMaxMOsmPerKg: text(fields.osmolalityMaxMOsmPerKg),
		preparationTemperatureC: text(fields.preparationTemperatureC),
		shelfLifeDays: text(fields.shelfLifeDays),
		storage: fields.storage,
		instructions: fields.instructions,
		changeNote: fields.changeNote
	};
}

/** Stored lines as the editor's text lines. */
export function toDraftLines(
	lines: {
		kind: LineKind;
		componentId: string | null;
		shelfFormId: string | null;
		stockRecipeId: string | null;
		amount: number;
		unit: string;
		tolerancePercent: number;
		note: string;
	}[]
): DraftLineInput[] {
	return lines.map((l) => ({
		kind: l.kind,
		componentId: l.componentId ?? '',
		shelfFormId: l.shelfFormId ?? '',
		stockRecipeId: l.stockRecipeId ?? '',
		amount: text(l.amount),
		unit: l.unit,
		tolerancePercent: text(l.tolerancePercent),
		note: l.note
	}));
}
