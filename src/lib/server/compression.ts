import { Readable } from 'node:stream';
import type { ReadableStream as NodeReadableStream } from 'node:stream/web';
import { promisify } from 'node:util';
import {
	brotliCompress,
	constants,
	createBrotliCompress,
	createGzip,
	gzip,
	type BrotliOptions
} from 'node:zlib';
import type { Handle } from '@sveltejs/kit';

const brotli = promisify(brotliCompress);
const gzipAsync = promisify(gzip);

const streamedBodies = new WeakSet<ReadableStream>();

/**
 * Marks a body produced a chunk at a time (a site-sized export): it is compressed as it streams,
 * never read whole into memory first.
 */
export function streamedBody<T extends ReadableStream>(body: T): T {
	streamedBodies.add(body);
	return body;
}

/** gzip's fastest level, for the same reason: 70 KB in 1.9 ms against 66 KB in 3.8 ms at 6. */
const GZIP_LEVEL = 1;

function brotliOptions(sizeHint?: number): BrotliOptions {
	return {
		params: {
			// Quality 1: answers are made per request, so speed counts more than the last bytes. On a
			// simulation's 185 KB of JSON it gives 66 KB in 1.1 ms against 62 KB in 3.8 ms at 4.
			[constants.BROTLI_PARAM_QUALITY]: 1,
			...(sizeHint === undefined ? {} : { [constants.BROTLI_PARAM_SIZE_HINT]: sizeHint })
		}
	};
}

function compressedStream(body: ReadableStream, encoding: 'br' | 'gzip'): ReadableStream {
	const compressor =
		encoding === 'br' ? createBrotliCompress(brotliOptions()) : createGzip({ level: GZIP_LEVEL });
	// A body that fails part-way fails the compressed answer too (the download ends short and the
	// browser says so), instead of an unhandled stream error ending the server.
	const source = Readable.fromWeb(body as NodeReadableStream);
	source.on('error', (cause) => compressor.destroy(cause));
	source.pipe(compressor);
	return Readable.toWeb(compressor) as ReadableStream;
}
/** Below this, compressing saves less than it costs. */
export const COMPRESS_FROM_BYTES = 8 * 1024;
const TEXT_TYPES = /^(application\/(json|problem\+json)|text\/(html|csv|plain))\b/;

/** The encoding to send in, from the client's Accept-Encoding: brotli first, then gzip. */
export function chosenEncoding(acceptEncoding: string | null): 'br' | 'gzip' | null {
	const offered = (acceptEncoding ?? '')
		.toLowerCase()
		.split(',')
		.map((part) => part.trim().split(';'))
		.filter(([, ...params]) => !params.some((p) => /^\s*q=0(\.0*)?\s*$/.test(p)))
		.map(([name]) => name.trim());
	if (offered.includes('br')) return 'br';
	if (offered.includes('gzip') || offered.includes('*')) return 'gzip';
	return null;
}

/**
 * Compresses large text answers (a simulation's series, a long list, a CSV) with brotli or gzip.
 * adapter-node compresses only its static files; this covers what the app answers. zlib's async
 * functions run in libuv's thread pool, so the event loop keeps serving while a body compresses.
 */
export const handleCompression: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	const encoding = chosenEncoding(event.request.headers.get('accept-encoding'));
	const type = response.headers.get('content-type') ?? '';
	if (
		!encoding ||
		!response.body ||
		response.headers.has('content-encoding') ||
		!TEXT_TYPES.test(type) ||
		event.request.method === 'HEAD'
	)
		return response;
	const headers = new Headers(response.headers);
	headers.append('vary', 'Accept-Encoding');
	if (streamedBodies.has(response.body)) {
		headers.set('content-encoding', encoding);
		headers.delete('content-length');
		return new Response(compressedStream(response.body, encoding), {
			status: response.status,
			statusText: response.statusText,
			headers
		});
	}
	const body = Buffer.from(await response.arrayBuffer());
	if (body.byteLength < COMPRESS_FROM_BYTES)
		return new Response(body, {
			status: response.status,
			statusText: response.statusText,
			headers
		});
	const compressed =
		encoding === 'br'
			? await brotli(body, brotliOptions(body.byteLength))
			: await gzipAsync(body, { level: GZIP_LEVEL });
	headers.set('content-encoding', encoding);
	headers.delete('content-length');
	return new Response(compressed, {
		status: response.status,
		statusText: response.statusText,
		headers
	});
};
