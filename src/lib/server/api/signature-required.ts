// An electronic signature is given only in the app: the signer types their password there, sees
// what they sign and what it means. The API never signs; it says where the signature is given.
import { config } from '../config';
import { problem } from './problem';

export const SIGNATURE_REQUIRED_TYPE = 'urn:brothwright:problem:signature-required';

/** The absolute address of a page of the app, as mail and printed records link to it. */
export function appPageUrl(path: string): string {
	return new URL(path, config.origin).href;
}

/**
 * The answer to an act that needs the signer's signature: 403 with the page where it is given.
 * `doing` starts the sentence: "Approving a recipe version".
 */
export function signatureRequired(doing: string, pagePath: string): Response {
	const signAt = appPageUrl(pagePath);
	return problem(
		403,
		`${doing} needs your signature with your password in the app: open ${signAt}`,
		{ type: SIGNATURE_REQUIRED_TYPE, signAt }
	);
}
