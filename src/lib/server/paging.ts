/** Reads ?page= safely: anything that is not a whole number from 1 up means the first page. */
export function pageFrom(url: URL): number {
	const page = Number(url.searchParams.get('page') ?? '1');
	return Number.isInteger(page) && page >= 1 ? page : 1;
}
