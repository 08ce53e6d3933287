import { findVersionById } from '../recipes/queries';
import { openWarnings } from '../recipes/open-warnings';

/** The demo approver's answer to each warning its recipes raise: known and accepted for the demo. */
export function demoAcknowledgements(versionId: string): Record<string, string> {
	const version = findVersionById(versionId);
	if (!version) return {};
	return Object.fromEntries(
		openWarnings(version).map((w) => [
			w.key,
			'Known for this demo medium and accepted for its use.'
		])
	);
}
