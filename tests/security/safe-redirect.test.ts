import { describe, expect, it } from 'vitest';
import { safeRedirectPath } from '$lib/safe-redirect';

/*
 * Forms that browsers (per the WHATWG URL standard's special-scheme parsing: `\` read as `/`, tab and
 * newline stripped) or decoding layers turn into another host or a script URL.
 */
const BYPASSES = [
	'//evil.example',
	'//evil.example/path',
	'///evil.example',
	'/\\evil.example',
	'\\\\evil',
	'\\/evil.example',
	'/%5Cevil.example',
	'/%5cevil.example',
	'/%255Cevil.example',
	'/%2F%2Fevil',
	'/%2f/evil',
	'%2F%2Fevil',
	'https://evil.example',
	'HTTPS://evil.example',
	'http:evil.example',
	'javascript:alert(1)',
	' javascript:alert(1)',
	'data:text/html,<script>alert(1)</script>',
	'/\t/evil',
	'/\n/evil',
	'/%09/evil',
	'/%0d%0aSet-Cookie:x=1',
	'\u0000/evil',
	'evil.example',
	'',
	`/${'a'.repeat(3000)}`
];

const LEGITIMATE = [
	'/',
	'/batches',
	'/admin/audit?page=2',
	'/lots?q=yeast%20extract&sort=expiry',
	'/recipes/abc/versions/3#notes',
	'/components?q=a%2Fb',
	'/studies?from=2026-01-01&to=2026-02-01'
];

describe('safeRedirectPath', () => {
	it.each(BYPASSES)('sends %j home', (target) => {
		expect(safeRedirectPath(target)).toBe('/');
	});

	it.each(LEGITIMATE)('keeps the same-site path %j', (target) => {
		expect(safeRedirectPath(target)).toBe(target);
	});

	it.each([null, undefined, 42, ['/batches']])('sends a non-string %j home', (target) => {
		expect(safeRedirectPath(target)).toBe('/');
	});

	it('leaves every kept path on the same origin when a browser resolves it', () => {
		const origin = 'https://brothwright.example';
		for (const target of [...BYPASSES, ...LEGITIMATE]) {
			expect(new URL(safeRedirectPath(target), origin).origin).toBe(origin);
		}
	});
});
