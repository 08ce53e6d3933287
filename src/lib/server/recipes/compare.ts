import { DRAFT_FIELD_LABELS } from '$lib/recipes';
import type { RecipeAnalysis } from './analysis';
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

/** Each line's place among the lines the other version also has. */
function rankOfShared(lines: ComparableLine[], other: Map<string, ComparableLine>) {
	const shared = [...lines]
		.sort((x, y) => x.position - y.position)
		.filter((l) => other.has(keyOf(l)));
	return new Map(shared.map((l, rank) => [keyOf(l), rank]));
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
	// Order is compared among the lines both versions have: removing line 2 moves every later line
	// up a number, but adds them in the same order as before.
	const rankBefore = rankOfShared(a.lines, after);
	const rankAfter = rankOfShared(b.lines, before);
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
		if (rankBefore.get(key) !== rankAfter.get(key))
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

export interface CompositionChange {
	label: string;
	unit: string;
	before: number | null;
	after: number | null;
}

/** Differences smaller than this share of the larger value are rounding, not a change. */
const SAME_WITHIN = 1e-6;

type ComparedAnalysis = Pick<
	RecipeAnalysis,
	| 'osmolality'
	| 'totalCarbonGPerL'
	| 'totalNitrogenGPerL'
	| 'ionicStrengthMolPerL'
	| 'dissolvedSolidsGPerL'
	| 'elements'
>;

/** What the line changes do to the finished medium: osmolality, C and N, solids, each element. */
export function compareCompositions(a: ComparedAnalysis, b: ComparedAnalysis): CompositionChange[] {
	const rows: CompositionChange[] = [
		{
			label: 'Osmolality, estimated',
			unit: 'mOsm/kg',
			before: a.osmolality.estimateMOsmPerKg,
			after: b.osmolality.estimateMOsmPerKg
		},
		{ label: 'Total carbon', unit: 'g/L', before: a.totalCarbonGPerL, after: b.totalCarbonGPerL },
		{
			label: 'Total nitrogen',
			unit: 'g/L',
			before: a.totalNitrogenGPerL,
			after: b.totalNitrogenGPerL
		},
		{
			label: 'Dissolved solids',
			unit: 'g/L',
			before: a.dissolvedSolidsGPerL,
			after: b.dissolvedSolidsGPerL
		},
		{
			label: 'Ionic strength',
			unit: 'mol/L',
			before: a.ionicStrengthMolPerL,
			after: b.ionicStrengthMolPerL
		}
	];
	const symbols = [...new Set([...a.elements, ...b.elements].map((e) => e.symbol))];
	const gPerL = (list: ComparedAnalysis['elements'], symbol: string) =>
		list.find((e) => e.symbol === symbol)?.gPerL ?? 0;
	for (const symbol of symbols)
		rows.push({
			label: symbol,
			unit: 'g/L',
			before: gPerL(a.elements, symbol),
			after: gPerL(b.elements, symbol)
		});
	return rows.filter(({ before, after }) => {
		if (before === null || after === null) return before !== after;
		return Math.abs(after - before) > SAME_WITHIN * Math.max(Math.abs(before), Math.abs(after));
	});
}
