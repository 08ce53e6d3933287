// Organism profiles and vessels for the API: one by id, or a cursor page of them by name or by the
// time of the last change.
import { and, count, eq, sql, type SQL } from 'drizzle-orm';
import { db } from '../db';
import { organismProfile, vessel, type OrganismProfileRow, type VesselRow } from '../db/schema';
import { cursorOf, keysetPageOf, rowsAfter, sortValueOf, type KeysetPage } from '../keyset';
import { orderFor, type SortDirection } from '../list-paging';

/** How a list of profiles or vessels can be sorted. */
export const RECORD_SORTS = ['name', 'updatedAt'] as const;
export type RecordSort = (typeof RECORD_SORTS)[number];

export interface RecordListQuery {
	q?: string;
	after?: string;
	limit: number;
	sort: RecordSort;
	dir: SortDirection;
}

type RecordTable = typeof organismProfile | typeof vessel;

/** The sort columns as plain SQL, so a cursor's raw value (a time in ms) is compared as it is stored. */
function sortColumns(table: RecordTable): Record<RecordSort, SQL> {
	return { name: sql`lower(${table.name})`, updatedAt: sql`${table.updatedAt}` };
}

function nameContains(table: RecordTable, search: string | undefined): SQL | undefined {
	if (!search) return undefined;
	const term = `%${search.toLowerCase().replace(/[%_]/g, '')}%`;
	return sql`lower(${table.name}) like ${term}`;
}

function recordsPage<Row extends { id: string }>(
	table: RecordTable,
	query: RecordListQuery
): KeysetPage<Row> {
	const column = sortColumns(table)[query.sort];
	const cursor = cursorOf(query);
	const filter = nameContains(table, query.q);
	const after = cursor ? rowsAfter(column, table.id, cursor) : undefined;
	// The union of the two tables is too wide for drizzle's select types; each caller names its row.
	const rows = db
		.select({ row: table as typeof vessel, sortValue: sortValueOf(column) })
		.from(table as typeof vessel)
		.where(and(filter, after))
		.orderBy(...orderFor(column, query.dir, table.id))
		.limit(query.limit + 1)
		.all()
		.map(({ row, sortValue }) => ({ ...(row as unknown as Row), sortValue }));
	const total = db
		.select({ n: count() })
		.from(table as typeof vessel)
		.where(filter)
		.get()!.n;
	return keysetPageOf(rows, query, total) as unknown as KeysetPage<Row>;
}

export function listProfilesAfter(query: RecordListQuery): KeysetPage<OrganismProfileRow> {
	return recordsPage<OrganismProfileRow>(organismProfile, query);
}

export function listVesselsAfter(query: RecordListQuery): KeysetPage<VesselRow> {
	return recordsPage<VesselRow>(vessel, query);
}

export function findProfile(id: string): OrganismProfileRow | undefined {
	return db.select().from(organismProfile).where(eq(organismProfile.id, id)).get();
}

export function findVessel(id: string): VesselRow | undefined {
	return db.select().from(vessel).where(eq(vessel.id, id)).get();
}
