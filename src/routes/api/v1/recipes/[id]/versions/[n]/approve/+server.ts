import { endpoint } from '$lib/server/api/endpoint';
import { signatureRequired } from '$lib/server/api/signature-required';
import { versionAt } from '$lib/server/recipes/version-api';

/** An approval is a signature: given on the version's page, never through the API. */
export const POST = endpoint({ act: 'recipe.sign' }, ({ event }) => {
	const { recipe, version } = versionAt(event.params);
	return signatureRequired('Approving', `/recipes/${recipe.id}/versions/${version.n}`);
});
