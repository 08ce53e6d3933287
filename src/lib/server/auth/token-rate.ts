// Requests a minute per token, as a token bucket: a token may spend its whole minute at once, then
// one request comes back every 60/limit seconds. Kept in memory: the server is one process, and a
// restart forgetting a minute of counts harms nobody.
const buckets = new Map<string, { left: number; at: number }>();

/** Null when the request may go ahead; else the whole seconds until one may. */
export function takeTokenRequest(
	tokenId: string,
	perMinute: number,
	nowMs = Date.now()
): number | null {
	const refillPerMs = perMinute / 60_000;
	const bucket = buckets.get(tokenId) ?? { left: perMinute, at: nowMs };
	const left = Math.min(perMinute, bucket.left + (nowMs - bucket.at) * refillPerMs);
	if (left >= 1) {
		buckets.set(tokenId, { left: left - 1, at: nowMs });
		return null;
	}
	buckets.set(tokenId, { left, at: nowMs });
	return Math.max(1, Math.ceil((1 - left) / refillPerMs / 1000));
}

/** Forgets a token's count (it was revoked, or a test starts afresh). */
export function forgetTokenRequests(tokenId?: string): void {
	if (tokenId === undefined) buckets.clear();
	else buckets.delete(tokenId);
}
