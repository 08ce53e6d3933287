import { problemsOfFieldErrors } from '$lib/server/api/refusals';
import { ApiProblem, endpoint } from '$lib/server/api/endpoint';
import { revisionFromIfMatch, withEtag } from '$lib/server/api/etag';
import { componentLabel, componentRequest } from '$lib/server/api/operations/components';
import { fieldsRefused, jsonObjectBody, readRecordBody } from '$lib/server/api/record-body';
import { checkComponentText } from '$lib/server/components/component-form';
import { findComponent, updateComponent } from '$lib/server/components/library';
import { actorOf } from '$lib/server/guard';

function componentOr404(id: string) {
	const row = findComponent(id);
	if (!row) throw new ApiProblem(404, 'No component with this id.');
	return row;
}

export const GET = endpoint({ act: 'component.view' }, ({ event }) => {
	const row = componentOr404(event.params.id!);
	return withEtag(row, row.revision);
});

/** The component page's save: its checks, then its store call with the revision If-Match names. */
export const PUT = endpoint(
	{ act: 'component.edit', body: jsonObjectBody },
	({ event, user, body }) => {
		const id = event.params.id!;
		const revision = revisionFromIfMatch(event, componentOr404(id).revision);
		const input = readRecordBody(componentRequest, body, componentLabel);
		const checked = checkComponentText(input, { selfId: id });
		if (!checked.ok)
			throw fieldsRefused(problemsOfFieldErrors(checked.fieldErrors), componentLabel);
		updateComponent(actorOf(user!), id, revision, checked.value);
		const row = componentOr404(id);
		return withEtag(row, row.revision);
	}
);
