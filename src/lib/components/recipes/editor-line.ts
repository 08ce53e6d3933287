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
