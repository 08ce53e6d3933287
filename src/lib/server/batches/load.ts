import { error } from '@sveltejs/kit';
import { RuleError } from '../rule-error';
import { batchView } from './view';

/** The batch view for a page or download; an unknown id is a 404 page, not a fault. */
export function batchViewOr404(id: string) {
	try {
		return batchView(id);
	} catch (cause) {
		if (cause instanceof RuleError && cause.status === 404) error(404, { message: cause.message });
		throw cause;
	}
}
