import { endpoint } from '$lib/server/api/endpoint';
import { signatureRequired } from '$lib/server/api/signature-required';
import { requireBatch } from '$lib/server/batches/execution';

/** A batch review (release or rejection) is a signature: given on the batch's page, never through the API. */
export const POST = endpoint({ act: 'batch.review' }, ({ event }) => {
	const batch = requireBatch(event.params.id!);
	return signatureRequired('Reviewing a batch', `/batches/${batch.id}`);
});
