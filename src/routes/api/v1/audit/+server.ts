import { ApiProblem, endpoint } from '$lib/server/api/endpoint';
import { auditListQuery } from '$lib/server/api/operations/audit';
import { parseQuery } from '$lib/server/api/query';
import { auditApiPage, decodeAuditCursor } from '$lib/server/trail/api-page';
import { readTrailFilter } from '$lib/server/trail/filter';

/** The query parameter each of the trail filter's refusals is about, by the label it starts with. */
const PROBLEM_PARAMETERS: [RegExp, string][] = [
	[/^Subject type:/, 'type'],
	[/^Subject:/, 'subject'],
	[/^From is after To/, 'from'],
	[/^From:/, 'from'],
	[/^To:/, 'to']
];

export const GET = endpoint({ act: 'admin.audit' }, ({ event }) => {
	const query = parseQuery(auditListQuery, event.url);
	const read = readTrailFilter(event.url);
	if (read.problems.length)
		throw new ApiProblem(
			400,
			read.problems.join(' '),
			read.problems.map((message) => ({
				path: PROBLEM_PARAMETERS.find(([label]) => label.test(message))?.[1] ?? 'query',
				message
			}))
		);
	return auditApiPage(
		read.filter,
		query.after === undefined ? null : decodeAuditCursor(query.after),
		query.limit
	);
});
