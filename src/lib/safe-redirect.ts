/** Where a redirect goes when the asked-for target is not a plain path on this site. */
export const SAFE_REDIRECT_FALLBACK = '/';

/** A base that no real request carries, to see whether a target would leave the origin. */
const PROBE_ORIGIN = 'http://same-origin.invalid';

// eslint-disable-next-line no-control-regex -- control characters are exactly what this refuses
const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f]/;

/** The target with percent-encoding undone as often as a browser or proxy might (at most 3 times). */
function decodedForms(target: string): string[] {
	const forms = [target];
	let current = target;
	for (let round = 0; round < 3; round++) {
		let next: string;
		try {
			next = decodeURIComponent(current);
		} catch {
			break; // a stray % cannot decode into anything dangerous
		}
		if (next === current) break;
		forms.push(next);
		current = next;
	}
	return forms;
}

function isPlainPath(form: string): boolean {
	return (
		form.startsWith('/') &&
		!form.startsWith('//') &&
		!form.includes('\\') &&
		!CONTROL_CHARACTERS.test(form)
	);
}

/**
 * The `next`/`redirect` target if it is a path on this origin, else `/`. Browsers read `//host`,
 * `/\host` and tab-split forms as another host, and some layers decode `%5C`/`%2F` before the
 * browser sees them, so every decoded form must pass too.
 */
export function safeRedirectPath(target: unknown): string {
	if (typeof target !== 'string' || target.length === 0 || target.length > 2048)
		return SAFE_REDIRECT_FALLBACK;
	if (!decodedForms(target).every(isPlainPath)) return SAFE_REDIRECT_FALLBACK;
	const resolved = new URL(target, PROBE_ORIGIN);
	return resolved.origin === PROBE_ORIGIN ? target : SAFE_REDIRECT_FALLBACK;
}
