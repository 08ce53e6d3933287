// The colour of an HTTP method's badge on the API reference page: reads are calm, deletions warn.
import { badgeClass } from '../variants';

const METHOD_COLOURS: Record<string, string> = {
	GET: 'bg-kelp-100 text-kelp-900',
	POST: 'bg-malt-100 text-malt-900',
	PUT: 'bg-caution-50 text-caution-800',
	PATCH: 'bg-caution-50 text-caution-800',
	DELETE: 'bg-halt-50 text-halt-800'
};

export function methodBadgeClass(method: string): string {
	return `${badgeClass} font-mono ${METHOD_COLOURS[method] ?? 'bg-oat-100 text-oat-800'}`;
}
