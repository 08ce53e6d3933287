/** Far past any real list; keeps the row offset inside what SQLite can count. */
export const MAX_PAGE = 1_000_000;

/**
 * Reads ?page= safely: anything that is not a whole number from 1 up means the first page, and an
 * absurdly large one the last page there could ever be (an empty list, not a database error).
 */
export function pageFrom(url: URL): number {
	const page = Number(url.searchParams.get('page') ?? '1');
	if (!Number.isInteger(page) || page < 1) return 1;
	return Math.min(page, MAX_PAGE);
}
