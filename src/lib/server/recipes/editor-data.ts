import type { PickerComponent } from '$lib/components/recipes/editor-line';
import {
	COMPONENT_CATEGORY_LABELS,
	type ComponentCategoryName,
	type DraftFieldsInput,
	type DraftLineInput
} from '$lib/recipes';
import { formLabelsOf } from '../components/form-label';
import type { Component } from '../db/schema';
import type { CheckedFields, CheckedLine } from './draft';

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
export function toDraftLines(lines: Omit<CheckedLine, 'position'>[]): DraftLineInput[] {
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

/** The library as the component picker searches and shows it. */
export function toPickerComponents(components: Component[]): PickerComponent[] {
	const forms = formLabelsOf(components);
	return components.map((c) => ({
		id: c.id,
		name: c.name,
		formula: c.formula,
		casNumber: c.casNumber,
		synonyms: c.synonyms,
		category: COMPONENT_CATEGORY_LABELS[c.category as ComponentCategoryName] ?? c.category,
		form: forms.get(c.id) ?? null,
		basisComponentId: c.basisComponentId
	}));
}
