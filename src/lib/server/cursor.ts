// Cursors for keyset pages: the sort key of the last row a page showed, opaque to clients
// (base64url of its parts joined by spaces), and the query fields that carry one with a page size.
import { z } from 'zod';
import { DEFAULT_PAGE_SIZE, MAX_PAGE_SIZE } from './list-paging';

export function encodeCursor(parts: readonly (string | number)[]): string {
	return Buffer.from(parts.join(' ')).toString('base64url');
}

/** The parts of a cursor of `count` parts, or null when the text is not one. */
export function decodeCursorParts(text: string, count: number): string[] | null {
	const parts = Buffer.from(text, 'base64url').toString('utf8').split(' ');
	return parts.length === count && parts.every((p) => p !== '') ? parts : null;
}

/**
 * The cursor parameter (`before` for newest-first pages, `after` for a list's order) and `limit`.
 * A cursor `decode` cannot read is refused, naming the parameter and the field that gives one.
 */
export function cursorFields<P extends string>(
	parameter: P,
	decode: (text: string) => unknown | null,
	givenAs: string
) {
	return {
		[parameter]: z
			.string()
			.max(200)
			.optional()
			.refine((v) => v === undefined || decode(v) !== null, {
				error: `${parameter} must be a cursor this list gave (${givenAs} of a previous page).`
			})
			.describe(`The \`${givenAs}\` cursor of the page before; absent: the first page`),
		limit: z.coerce
			.number({ error: 'limit must be a whole number.' })
			.int('limit must be a whole number.')
			.min(1, 'limit starts at 1.')
			.max(MAX_PAGE_SIZE, `limit is at most ${MAX_PAGE_SIZE}.`)
			.default(DEFAULT_PAGE_SIZE)
			.describe(`Rows per page (at most ${MAX_PAGE_SIZE})`)
	} as { [K in P]: z.ZodOptional<z.ZodString> } & {
		limit: z.ZodDefault<z.ZodCoercedNumber<unknown>>;
	};
}
