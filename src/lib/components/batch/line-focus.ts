// Where a keyboard-wedge scanner types next on the batch page: the first open line's mass field
// when its lot is chosen, else its scan field. The page calls this when it opens and a line card
// after its line is signed, so the next scan never types into nothing.

/** Focuses the next field to fill in `root`; false when every line is done. */
export function focusFirstOpenLine(root: ParentNode = document): boolean {
	const card = root.querySelector<HTMLElement>('[data-line-open="true"]');
	if (!card) return false;
	const field =
		card.querySelector<HTMLInputElement>('input[data-mass-field]') ??
		card.querySelector<HTMLInputElement>('input[data-scan-field]');
	field?.focus();
	return field !== null;
}
