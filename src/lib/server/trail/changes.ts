import { LOT_STATUS_LABELS, LOT_STATUSES, type LotStatus } from '$lib/inventory';
import { isRole, ROLE_LABELS } from '$lib/roles';
import type { Detail } from './describe';

/** One changed value as the trail shows it: "Reorder level (g): 500 → 750". */
export interface ChangeLine {
	field: string;
	from: string;
	to: string;
}

// Longest first, so "GPerMl" wins over "Ml".
const UNIT_SUFFIXES: [RegExp, string][] = [
	[/MOsmPerKg$/, 'mOsm/kg'],
	[/GPerMl$/, 'g/mL'],
	[/GPerL$/, 'g/L'],
	[/PerH$/, 'per h'],
	[/Percent$/, '%'],
	[/Days$/, 'days'],
	[/Ml$/, 'mL'],
	[/Ug$/, 'µg'],
	[/Mg$/, 'mg'],
	[/G$/, 'g'],
	[/L$/, 'L'],
	[/C$/, '°C'],
	[/K$/, 'K']
];

/** "reorderLevelG" → "Reorder level (g)"; "targetPh" → "Target pH". */
export function fieldWords(field: string): string {
	let name = field;
	let unit = '';
	for (const [pattern, label] of UNIT_SUFFIXES) {
		if (pattern.test(name) && name.replace(pattern, '').length > 1) {
			unit = label;
			name = name.replace(pattern, '');
			break;
		}
	}
	const words = name
		.replace(/_/g, ' ')
		.replace(/([a-z0-9])([A-Z])/g, '$1 $2')
		.toLowerCase()
		.replace(/\bph\b/g, 'pH')
		.replace(/\bid\b/g, 'id')
		.trim();
	const capital = words.charAt(0).toUpperCase() + words.slice(1);
	return unit ? `${capital} (${unit})` : capital;
}

/** A stored value in words: empty for nothing, roles by their labels, lists joined. */
export function valueWords(value: unknown): string {
	if (value === null || value === undefined || value === '') return '(empty)';
	if (typeof value === 'boolean') return value ? 'yes' : 'no';
	if (Array.isArray(value)) {
		if (value.length === 0) return '(none)';
		return value
			.map((v) => (typeof v === 'string' && isRole(v) ? ROLE_LABELS[v] : valueWords(v)))
			.join(', ');
	}
	if (typeof value === 'object') {
		return Object.entries(value as Record<string, unknown>)
			.filter(([, v]) => v !== null && v !== undefined && v !== '')
			.map(([k, v]) => `${fieldWords(k).toLowerCase()} ${valueWords(v)}`)
			.join(', ');
	}
	return String(value);
}

// What a top-level from/to or before/after is the value of, per action.
const TOP_LEVEL_FIELDS: Record<string, string> = {
	'settings.batch_number_pattern': 'Batch number pattern',
	'simulation.scenario_updated': 'Name',
	'person.roles_changed': 'Roles'
};

function isFromTo(value: unknown): value is { from: unknown; to: unknown } {
	return typeof value === 'object' && value !== null && 'from' in value && 'to' in value;
}

/**
 * The old and new values an entry's detail carries, in whichever of the shapes the writers use:
 * `changes: { field: { from, to } }`, `lineChanges: [{ position, from, to }]`, a top-level
 * `from`/`to` or `before`/`after`, or fields that are themselves `{ from, to }`.
 */
export function changeLines(action: string, detail: Detail | null): ChangeLine[] {
	if (!detail) return [];
	const topLevel = TOP_LEVEL_FIELDS[action] ?? 'Value';
	const lines: ChangeLine[] = [];
	const push = (field: string, from: unknown, to: unknown) =>
		lines.push({ field, from: valueWords(from), to: valueWords(to) });
	if (detail.changes && typeof detail.changes === 'object') {
		for (const [field, change] of Object.entries(detail.changes as Record<string, unknown>)) {
			if (isFromTo(change)) push(fieldWords(field), change.from, change.to);
		}
	}
	if (Array.isArray(detail.lineChanges)) {
		for (const change of detail.lineChanges as unknown[]) {
			if (!isFromTo(change)) continue;
			const position = (change as { position?: unknown }).position;
			push(`Line ${valueWords(position)}`, change.from, change.to);
		}
	}
	if ('from' in detail && 'to' in detail) push(topLevel, detail.from, detail.to);
	// A lot's status change keeps only the old status; the new one is the action's own name.
	const newStatus = action.slice('lot.'.length) as LotStatus;
	if (action.startsWith('lot.') && LOT_STATUSES.includes(newStatus) && !('to' in detail)) {
		const oldStatus = detail.from as LotStatus;
		push('Status', LOT_STATUS_LABELS[oldStatus] ?? detail.from, LOT_STATUS_LABELS[newStatus]);
	}
	if ('before' in detail && 'after' in detail) push(topLevel, detail.before, detail.after);
	for (const [field, value] of Object.entries(detail)) {
		if (field !== 'changes' && isFromTo(value)) push(fieldWords(field), value.from, value.to);
	}
	return lines;
}
