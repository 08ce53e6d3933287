import { error } from '@sveltejs/kit';
import { requirePermission } from '$lib/server/guard';
import {
	contentDisposition,
	findCertificate,
	readCertificateBytes
} from '$lib/server/inventory/certificates';
import { RuleError } from '$lib/server/rule-error';
import type { RequestHandler } from './$types';

/** Certificates are for signed-in people only, and always sent as a download of the type we sniffed. */
export const GET: RequestHandler = async ({ params }) => {
	requirePermission('lot.view');
	const row = findCertificate(params.id, params.certificateId);
	if (!row) error(404, { message: 'No such certificate on this lot.' });
	let bytes: Buffer;
	try {
		bytes = readCertificateBytes(row);
	} catch (cause) {
		if (cause instanceof RuleError) error(cause.status, { message: cause.message });
		throw cause;
	}
	return new Response(new Uint8Array(bytes), {
		headers: {
			'content-type': row.mediaType,
			'content-length': String(bytes.length),
			'content-disposition': contentDisposition(row.displayName),
			'cache-control': 'private, no-store',
			'content-security-policy': "default-src 'none'; sandbox"
		}
	});
};
