import type { Handle } from '@sveltejs/kit';
import { config } from './config';

/** The batch finder scans a code with the camera; nothing uses the microphone or location. */
export const PERMISSIONS_POLICY =
	'camera=(self), microphone=(), geolocation=(), payment=(), usb=()';

const ONE_YEAR_S = 31_536_000;

/**
 * Headers the framework's CSP (svelte.config.js) does not cover. Anything shown to a signed-in
 * person, pages and downloads (CSV, PDF) alike, is never stored by a browser or proxy cache.
 */
export const handleHardeningHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	const headers = response.headers;
	const set = (name: string, value: string) => {
		try {
			headers.set(name, value);
		} catch {
			// a Response built from fetch() has immutable headers; it carries its own
		}
	};
	set('permissions-policy', PERMISSIONS_POLICY);
	set('x-content-type-options', 'nosniff');
	if (!headers.has('referrer-policy')) set('referrer-policy', 'same-origin');
	if (config.origin.startsWith('https:'))
		set('strict-transport-security', `max-age=${ONE_YEAR_S}; includeSubDomains`);
	if (event.locals.user) set('cache-control', 'private, no-store');
	return response;
};
