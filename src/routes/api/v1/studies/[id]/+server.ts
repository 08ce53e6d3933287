import { endpoint } from '$lib/server/api/endpoint';
import { revisionFromIfMatch } from '$lib/server/api/etag';
import { studyRequest } from '$lib/server/api/operations/study-writes';
import { actorOf } from '$lib/server/guard';
import { studyAnswer, studyRecord, updateStudyFromApi } from '$lib/server/studies/study-api';

export const GET = endpoint({ act: 'study.use' }, ({ event }) => studyAnswer(event.params.id!));

export const PUT = endpoint(
	{ act: 'study.use', body: studyRequest },
	async ({ event, user, body }) => {
		const { id, revision: current } = studyRecord(event.params.id!);
		const revision = revisionFromIfMatch(event, current);
		await updateStudyFromApi(actorOf(user!), id, revision, body);
		return studyAnswer(id);
	}
);
