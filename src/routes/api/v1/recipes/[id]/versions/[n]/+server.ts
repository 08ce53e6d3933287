import { ApiProblem, endpoint } from '$lib/server/api/endpoint';
import { versionView } from '$lib/server/recipes/view';

export const GET = endpoint({ act: 'recipe.view' }, ({ event }) => {
	const n = Number(event.params.n);
	if (!Number.isInteger(n) || n < 1)
		throw new ApiProblem(
			400,
			`A version number is a whole number from 1, not “${event.params.n}”.`,
			[{ path: 'n', message: 'Not a version number.' }]
		);
	const { analysis, ...view } = versionView(event.params.id!, n);
	return { ...view, composition: analysis };
});
