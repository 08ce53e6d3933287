import { and, asc, count, eq, inArray, sql, type SQL } from 'drizzle-orm';
import { db } from '../db';
import { organismProfile, study, studyFeed, user, vessel } from '../db/schema';
import { cursorOf, keysetPageOf, rowsAfter, sortValueOf, type KeysetQuery } from '../keyset';
import { offsetOf, orderFor, sortKeys, type ListPage, type Paging } from '../list-paging';
import { describeVersions, type VersionRef } from './queries';

const STUDY_SORT_COLUMNS = {
	name: sql`lower(${study.name})`,
	organism: sql`lower(${organismProfile.name})`,
	vessel: sql`lower(${vessel.name})`,
	updatedAt: study.updatedAt
} as const;

export const STUDY_SORTS = sortKeys(STUDY_SORT_COLUMNS);
export type StudySort = keyof typeof STUDY_SORT_COLUMNS;

function studyConditions(search: string | undefined): SQL | undefined {
	if (!search) return undefined;
	const term = `%${search.toLowerCase().replace(/[%_]/g, '')}%`;
	return and(
		sql`(lower(${study.name}) like ${term} or lower(${organismProfile.name}) like ${term} or lower(${vessel.name}) like ${term})`
	);
}

export type StudyListRow = ReturnType<typeof listStudiesPage>['rows'][number];

/** The studies the condition matches with their profile, vessel and author, unordered. */
function selectStudies<E extends Record<string, SQL>>(where: SQL | undefined, extra: E = {} as E) {
	return db
		.select({
			...extra,
			id: study.id,
			name: study.name,
			targetBasis: study.targetBasis,
			targetValue: study.targetValue,
			basalVersionId: study.basalVersionId,
			profileName: organismProfile.name,
			vesselName: vessel.name,
			createdByName: user.name,
			updatedAt: study.updatedAt
		})
		.from(study)
		.innerJoin(organismProfile, eq(study.profileId, organismProfile.id))
		.innerJoin(vessel, eq(study.vesselId, vessel.id))
		.innerJoin(user, eq(study.createdById, user.id))
		.where(where);
}

/** Each study with the recipe versions it uses: its basal medium and its feeds. */
function withVersions<R extends { id: string; basalVersionId: string }>(rows: R[]) {
	// The feeds of this page's studies only: at most a page of ids is bound.
	const feeds = rows.length
		? db
				.select()
				.from(studyFeed)
				.where(
					inArray(
						studyFeed.studyId,
						rows.map((r) => r.id)
					)
				)
				.orderBy(asc(studyFeed.position))
				.all()
		: [];
	const versions = describeVersions([
		...rows.map((r) => r.basalVersionId),
		...feeds.map((f) => f.versionId)
	]);
	return rows.map((r) => ({
		...r,
		basal: versions.get(r.basalVersionId)! as VersionRef,
		feeds: feeds
			.filter((f) => f.studyId === r.id)
			.map((f) => ({ ...versions.get(f.versionId)!, volumeL: f.volumeL }))
	}));
}

function countStudies(where: SQL | undefined): number {
	return db
		.select({ n: count() })
		.from(study)
		.innerJoin(organismProfile, eq(study.profileId, organismProfile.id))
		.innerJoin(vessel, eq(study.vesselId, vessel.id))
		.where(where)
		.get()!.n;
}

/** One page of the saved studies with the recipe versions each uses, and the count of all. */
export function listStudiesPage(search: string | undefined, paging: Paging<StudySort>) {
	const where = studyConditions(search);
	const rows = selectStudies(where)
		.orderBy(...orderFor(STUDY_SORT_COLUMNS[paging.sort], paging.dir, study.id))
		.limit(paging.limit)
		.offset(offsetOf(paging))
		.all();
	return { rows: withVersions(rows), total: countStudies(where) } satisfies ListPage<unknown>;
}

/** The studies after the query's cursor, as the page lists them, with the count and next cursor. */
export function listStudiesByCursor(search: string | undefined, query: KeysetQuery<StudySort>) {
	const where = studyConditions(search);
	const cursor = cursorOf(query);
	const sortColumn = STUDY_SORT_COLUMNS[query.sort];
	const rowsRead = selectStudies(and(where, cursor && rowsAfter(sortColumn, study.id, cursor)), {
		sortValue: sortValueOf(sortColumn)
	})
		.orderBy(...orderFor(sortColumn, query.dir, study.id))
		.limit(query.limit + 1)
		.all();
	return keysetPageOf(withVersions(rowsRead), query, countStudies(where));
}
