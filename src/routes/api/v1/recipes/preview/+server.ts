import { ApiProblem, endpoint } from '$lib/server/api/endpoint';
import { previewRequest } from '$lib/server/api/operations/recipes';
import { DraftProblems, previewDraft } from '$lib/server/recipes/preview';

export const POST = endpoint({ act: 'calculation.run', body: previewRequest }, ({ body }) => {
	try {
		return previewDraft(body);
	} catch (cause) {
		if (!(cause instanceof DraftProblems)) throw cause;
		const errors = Object.entries(cause.fieldErrors).flatMap(([path, messages]) =>
			messages.map((message) => ({ path, message }))
		);
		throw new ApiProblem(400, cause.message, errors);
	}
});
