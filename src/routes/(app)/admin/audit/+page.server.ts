import { listAuditActions, listAuditEvents } from '$lib/server/audit';
import { requirePermission } from '$lib/server/guard';
import { pageFrom } from '$lib/server/paging';
import { readableCode } from '$lib/server/trail/describe';
import { readableEntries } from '$lib/server/trail/entries';
import { readTrailFilter, trailQuery } from '$lib/server/trail/filter';
import { resolveSubjects, subjectKey, SUBJECT_TYPES } from '$lib/server/trail/subjects';
import type { PageServerLoad } from './$types';

const PAGE_SIZE = 50;

export const load: PageServerLoad = async ({ url }) => {
	requirePermission('admin.audit');
	const page = pageFrom(url);
	const read = readTrailFilter(url);
	const { rows, total } = listAuditEvents({ ...read.filter, page, pageSize: PAGE_SIZE });
	const { subjectType, subjectId } = read.filter;
	const focus =
		subjectType && subjectId
			? resolveSubjects([{ subjectType, subjectId }]).get(subjectKey(subjectType, subjectId))!
			: null;
	return {
		entries: readableEntries(rows),
		total,
		page,
		pageSize: PAGE_SIZE,
		actions: listAuditActions().map((value) => ({ value, label: readableCode(value) })),
		subjectTypes: SUBJECT_TYPES,
		focus,
		filter: read.text,
		exportQuery: trailQuery(read.text),
		filterErrors: read.problems
	};
};
