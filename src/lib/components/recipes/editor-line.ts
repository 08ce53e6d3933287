import type { SearchableComponent } from '$lib/component-search';
import type { DraftLineInput } from '$lib/recipes';

export interface EditorLine extends DraftLineInput {
	key: string;
	/** What the person typed in the component box; `componentId` is the match, or the text itself. */
	componentText: string;
}

/** A library component as the editor's picker lists it. */
export interface PickerComponent extends SearchableComponent {
	/** Category label: Salt, Sugar, Complex material … */
	category: string;
	/** Hydrate, anhydrous, solution …, or null when nothing sets it apart (form-label.ts). */
	form: string | null;
	basisComponentId: string | null;
}

let counter = 0;

/** A line with a key for the list and the component's name in the search box. */
export function toEditorLine(line: DraftLineInput, components: PickerComponent[]): EditorLine {
	counter++;
	return {
		...line,
		key: `line-${counter}`,
		componentText: components.find((c) => c.id === line.componentId)?.name ?? line.componentId
	};
}

export function isBlankLine(line: DraftLineInput): boolean {
	return !line.componentId && !line.stockRecipeId && !line.amount.trim();
}

/** The line without the editor's own fields, as the server reads it. */
export function toDraftLine({
	key: _key,
	componentText: _text,
	...line
}: EditorLine): DraftLineInput {
	return line;
}

/**
 * The columns of an editor line and of the header above the lines: below 1024 px the number, the
 * component, amount and unit, with the rest on a second row; from 1024 px one row per line.
 */
export const LINE_GRID_CLASS =
	'grid grid-cols-[1.25rem_minmax(0,1fr)_5.5rem_4.5rem] items-start gap-x-1.5 gap-y-2 lg:grid-cols-[1.25rem_minmax(10rem,2.5fr)_4.75rem_4rem_5.75rem_3.5rem_minmax(5rem,1fr)_6.75rem]';
