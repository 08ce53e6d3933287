import { error } from '@sveltejs/kit';
import { RuleError } from '../rule-error';
import { versionNumber } from './access';
import { versionView } from './view';

/** The version view for a page, with a missing recipe or version answered as a 404 page. */
export function loadVersionView(params: { id: string; n: string }) {
	try {
		return versionView(params.id, versionNumber(params.n));
	} catch (cause) {
		if (cause instanceof RuleError) error(cause.status, { message: cause.message });
		throw cause;
	}
}
