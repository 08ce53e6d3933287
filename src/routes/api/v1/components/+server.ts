import { problemsOfFieldErrors } from '$lib/server/api/refusals';
import { endpoint } from '$lib/server/api/endpoint';
import { componentFilterOf, componentListQuery } from '$lib/server/api/operations/recipes';
import { parseQuery } from '$lib/server/api/query';
import { listComponentsByCursor } from '$lib/server/components/component-list';
import { componentLabel, componentRequest } from '$lib/server/api/operations/components';
import {
	createdRecord,
	fieldsRefused,
	jsonObjectBody,
	readRecordBody
} from '$lib/server/api/record-body';
import { checkComponentText } from '$lib/server/components/component-form';
import { createComponent, findComponent } from '$lib/server/components/library';
import { db } from '$lib/server/db';
import { actorOf } from '$lib/server/guard';

export const GET = endpoint({ act: 'component.view' }, ({ event }) => {
	const query = parseQuery(componentListQuery, event.url);
	return listComponentsByCursor(componentFilterOf(query), query);
});

/** The new-component page's checks and store call: see routes/(app)/components/new. */
export const POST = endpoint({ act: 'component.edit', body: jsonObjectBody }, ({ user, body }) => {
	const input = readRecordBody(componentRequest, body, componentLabel);
	const checked = checkComponentText(input);
	if (!checked.ok) throw fieldsRefused(problemsOfFieldErrors(checked.fieldErrors), componentLabel);
	const actor = actorOf(user!);
	const id = db.transaction((tx) => createComponent(actor, checked.value, tx));
	const row = findComponent(id)!;
	return createdRecord(`/api/v1/components/${id}`, row, row.revision);
});
