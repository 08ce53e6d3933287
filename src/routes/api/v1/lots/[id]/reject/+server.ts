import { endpoint } from '$lib/server/api/endpoint';
import { signatureRequired } from '$lib/server/api/signature-required';
import { findLot } from '$lib/server/inventory/lots';
import { RuleError } from '$lib/server/rule-error';

/** Rejecting a lot is a signature: given on the lot's page, never through the API. */
export const POST = endpoint({ act: 'lot.keep' }, ({ event }) => {
	const lot = findLot(event.params.id!);
	if (!lot) throw new RuleError('No lot with this id.', { status: 404 });
	return signatureRequired('Rejecting a lot', `/lots/${lot.id}`);
});
