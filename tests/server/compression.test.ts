// Large text answers go out compressed when the client accepts it; node:zlib's synchronous
// decoders (an independent path from the async encoders the hook uses) must give the body back.
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import type { RequestEvent } from '@sveltejs/kit';
import { describe, expect, it } from 'vitest';
import { chosenEncoding, COMPRESS_FROM_BYTES, handleCompression } from '$lib/server/compression';

const bigJson = JSON.stringify({ t: Array.from({ length: 20_000 }, (_, i) => i / 60) });

async function answer(body: string, type: string, acceptEncoding?: string) {
	const event = {
		request: new Request('http://127.0.0.1/api/v1/simulate', {
			headers: acceptEncoding ? { 'accept-encoding': acceptEncoding } : {}
		})
	} as unknown as RequestEvent;
	return handleCompression({
		event,
		resolve: async () => new Response(body, { headers: { 'content-type': type } })
	});
}

describe('compression of answers', () => {
	it('reads Accept-Encoding: brotli first, gzip next, q=0 refuses', () => {
		expect(chosenEncoding('gzip, deflate, br, zstd')).toBe('br');
		expect(chosenEncoding('gzip;q=1.0, br;q=0')).toBe('gzip');
		expect(chosenEncoding('*')).toBe('gzip');
		expect(chosenEncoding('identity')).toBeNull();
		expect(chosenEncoding(null)).toBeNull();
	});

	it('sends a large JSON body in brotli or gzip that decodes to the same bytes', async () => {
		const br = await answer(bigJson, 'application/json', 'br, gzip');
		expect(br.headers.get('content-encoding')).toBe('br');
		expect(br.headers.get('vary')).toContain('Accept-Encoding');
		const brBytes = Buffer.from(await br.arrayBuffer());
		expect(brBytes.byteLength).toBeLessThan(bigJson.length / 3);
		expect(brotliDecompressSync(brBytes).toString()).toBe(bigJson);

		const gz = await answer(bigJson, 'text/csv; charset=utf-8', 'gzip');
		expect(gz.headers.get('content-encoding')).toBe('gzip');
		expect(gunzipSync(Buffer.from(await gz.arrayBuffer())).toString()).toBe(bigJson);
	});

	it('leaves small bodies, binary types and clients without an encoding alone', async () => {
		const small = await answer('{"ok":true}', 'application/json', 'br');
		expect(small.headers.get('content-encoding')).toBeNull();
		expect(await small.text()).toBe('{"ok":true}');
		expect('{"ok":true}'.length).toBeLessThan(COMPRESS_FROM_BYTES);
		const pdf = await answer(bigJson, 'application/pdf', 'br');
		expect(pdf.headers.get('content-encoding')).toBeNull();
		const plain = await answer(bigJson, 'application/json');
		expect(plain.headers.get('content-encoding')).toBeNull();
		expect(await plain.text()).toBe(bigJson);
	});
});
