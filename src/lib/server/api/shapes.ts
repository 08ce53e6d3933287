import { z } from 'zod';
import { isoTime } from '$chemistry';

// The generic binding of a schema to its type lives beside the science, which uses it too.
export { describes, documentsPartOf, isoTime, type Wire } from '$chemistry';

/** An electronic signature as recipes, lots and batches answer it (`ESignature`). */
export const signatureResponse = z.object({
	id: z.string(),
	signerId: z.string(),
	signerEmail: z.string(),
	signerName: z.string(),
	meaning: z.string(),
	subjectType: z.string(),
	subjectId: z.string(),
	subjectDigest: z.string().nullable().describe('SHA-256 of the signed content'),
	comment: z.string(),
	signedAt: isoTime(),
	seq: z.number().nullable().describe('place in the chain of signatures'),
	prevHash: z.string().nullable().describe('row hash of the signature before it in the chain'),
	rowHash: z
		.string()
		.nullable()
		.describe('SHA-256 of this signature with its place and the previous hash (tamper evidence)')
});
