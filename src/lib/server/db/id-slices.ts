// SQLite caps the parameters bound to one statement (32,766 here); a list can name more ids.
export const IDS_PER_QUERY = 900;

/** The distinct ids in slices small enough to bind, for `inArray` over a list of any length. */
export function* idSlices<T>(ids: Iterable<T>): Generator<T[]> {
	const distinct = [...new Set(ids)];
	for (let start = 0; start < distinct.length; start += IDS_PER_QUERY)
		yield distinct.slice(start, start + IDS_PER_QUERY);
}
