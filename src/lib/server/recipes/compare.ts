import { DRAFT_FIELD_LABELS } from '$lib/recipes';
import type { CheckedFields } from './draft';

export interface ComparableLine {
	position: number;
	kind: string;
	componentId: string | null;
	componentName: string | null;
	shelfFormId: string | null;
	shelfFormName: string | null;
	stockRecipeId: string | null;
	stockRecipeName: string | null;
	amount: number;
	unit: string;
	tolerancePercent: number;
	note: string;
}

export type LineChange = {
	key: string;
	name: string;
	status: 'added' | 'removed' | 'changed' | 'same';
	before: ComparableLine | null;
	after: ComparableLine | null;
	changes: string[];
};

export interface VersionComparison {
	fields: { field: keyof CheckedFields; label: string; before: string; after: string }[];
	lines: LineChange[];
}

function keyOf(line: ComparableLine): string {
	return line.kind === 'stock' ? `stock:${line.stockRecipeId}` : `component:${line.componentId}`;
}

function nameOf(line: ComparableLine): string {
	return (line.kind === 'stock' ? line.stockRecipeName : line.componentName) ?? '(missing)';
}

function shown(value: unknown): string {
	return value === null || value === undefined || value === '' ? '—' : String(value);
}

/** Line by line, matched on what the line adds (component or stock), then the fields that differ. */
export function compareVersions(
	a: { fields: CheckedFields; lines: ComparableLine[] },
	b: { fields: CheckedFields; lines: ComparableLine[] }
): VersionComparison {
	const fields = (Object.keys(DRAFT_FIELD_LABELS) as (keyof CheckedFields)[])
		.filter((f) => a.fields[f] !== b.fields[f])
		.map((f) => ({
			field: f,
			label: DRAFT_FIELD_LABELS[f],
			before: shown(a.fields[f]),
			after: shown(b.fields[f])
		}));

	const before = new Map(a.lines.map((l) => [keyOf(l), l]));
	const after = new Map(b.lines.map((l) => [keyOf(l), l]));
	const lines: LineChange[] = [];
	for (const line of b.lines) {
		const key = keyOf(line);
		const old = before.get(key);
		if (!old) {
			lines.push({
				key,
				name: nameOf(line),
				status: 'added',
				before: null,
				after: line,
				changes: []
			});
			continue;
		}
		const changes: string[] = [];
		if (old.amount !== line.amount || old.unit !== line.unit)
			changes.push(`amount ${old.amount} ${old.unit} → ${line.amount} ${line.unit}`);
		if (old.shelfFormId !== line.shelfFormId)
			changes.push(`form weighed ${shown(old.shelfFormName)} → ${shown(line.shelfFormName)}`);
		if (old.position !== line.position)
			changes.push(`order of addition ${old.position} → ${line.position}`);
		if (old.tolerancePercent !== line.tolerancePercent)
			changes.push(`tolerance ${old.tolerancePercent} % → ${line.tolerancePercent} %`);
		if (old.note !== line.note) changes.push(`note “${shown(old.note)}” → “${shown(line.note)}”`);
		lines.push({
			key,
			name: nameOf(line),
			status: changes.length ? 'changed' : 'same',
			before: old,
			after: line,
			changes
		});
	}
	for (const line of a.lines) {
		const key = keyOf(line);
		if (!after.has(key))
			lines.push({
				key,
				name: nameOf(line),
				status: 'removed',
				before: line,
				after: null,
				changes: []
			});
	}
	return { fields, lines };
}
