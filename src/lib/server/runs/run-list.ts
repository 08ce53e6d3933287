import { and, count, eq, sql, type SQL } from 'drizzle-orm';
import { db } from '../db';
import { organismProfile, run, study, vessel } from '../db/schema';
import { cursorOf, keysetPageOf, rowsAfter, sortValueOf, type KeysetQuery } from '../keyset';
import { offsetOf, orderFor, sortKeys, type Paging } from '../list-paging';

const RUN_SORT_COLUMNS = {
	number: run.number,
	name: sql`lower(${run.name})`,
	startedAt: run.startedAt,
	vessel: sql`lower(${vessel.name})`
} as const;

export const RUN_SORTS = sortKeys(RUN_SORT_COLUMNS);
export type RunSort = keyof typeof RUN_SORT_COLUMNS;

function runConditions(search: string | undefined): SQL | undefined {
	if (!search) return undefined;
	const term = `%${search.toLowerCase().replace(/[%_]/g, '')}%`;
	return sql`(lower(${run.number}) like ${term} or lower(${run.name}) like ${term} or lower(${study.name}) like ${term} or lower(${vessel.name}) like ${term})`;
}

export type RunListRow = ReturnType<typeof listRunsPage>['rows'][number];

/** The runs the condition matches with their plan, vessel and organism, unordered. */
function selectRuns<E extends Record<string, SQL>>(where: SQL | undefined, extra: E = {} as E) {
	return db
		.select({
			...extra,
			id: run.id,
			number: run.number,
			name: run.name,
			state: run.state,
			startedAt: run.startedAt,
			endedAt: run.endedAt,
			studyId: run.studyId,
			studyName: study.name,
			vesselName: vessel.name,
			profileName: organismProfile.name
		})
		.from(run)
		.innerJoin(study, eq(run.studyId, study.id))
		.innerJoin(vessel, eq(run.vesselId, vessel.id))
		.innerJoin(organismProfile, eq(run.profileId, organismProfile.id))
		.where(where);
}

function countRuns(where: SQL | undefined): number {
	return db
		.select({ n: count() })
		.from(run)
		.innerJoin(study, eq(run.studyId, study.id))
		.innerJoin(vessel, eq(run.vesselId, vessel.id))
		.where(where)
		.get()!.n;
}

/** One page of runs with their plan, vessel and organism, and the count of all that match. */
export function listRunsPage(search: string | undefined, paging: Paging<RunSort>) {
	const where = runConditions(search);
	const rows = selectRuns(where)
		.orderBy(...orderFor(RUN_SORT_COLUMNS[paging.sort], paging.dir, run.id))
		.limit(paging.limit)
		.offset(offsetOf(paging))
		.all();
	return { rows, total: countRuns(where) };
}

/** The runs after the query's cursor, sorted as asked, with the count of all and the next cursor. */
export function listRunsByCursor(search: string | undefined, query: KeysetQuery<RunSort>) {
	const where = runConditions(search);
	const cursor = cursorOf(query);
	const sortColumn = RUN_SORT_COLUMNS[query.sort];
	const rowsRead = selectRuns(and(where, cursor && rowsAfter(sortColumn, run.id, cursor)), {
		sortValue: sortValueOf(sortColumn)
	})
		.orderBy(...orderFor(sortColumn, query.dir, run.id))
		.limit(query.limit + 1)
		.all();
	return keysetPageOf(rowsRead, query, countRuns(where));
}
