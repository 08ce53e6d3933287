// A CSV export read a chunk at a time by keyset, so a site-sized table (480,000 ledger entries) is
// never held whole in memory and never blocks the server: the download streams, and the event loop
// serves other requests between chunks. Node's streams could do the chunking, but the chunks come
// from synchronous SQLite reads that must not hold a statement open across a yield, so each chunk
// is a fresh keyset query.
import { streamedBody } from './compression';
import { csvHeaders, unparseCsv, unparseCsvRows } from './csv';

/** The next `limit` rows after the row keyed `after` (null: from the start), and the last row's key. */
export type CsvChunkReader<K> = (
	after: K | null,
	limit: number
) => { rows: unknown[][]; last: K | null };

export interface CsvExport<K> {
	columns: readonly string[];
	/** lines written before the header as `# …` */
	comments?: string[];
	read: CsvChunkReader<K>;
}

export const CSV_CHUNK_ROWS = 250;

function preamble(comments: string[] = []): string {
	return comments.map((c) => `# ${c.replace(/[\r\n]+/g, ' ')}\r\n`).join('');
}

/** Each chunk's text in order: the preamble and header with the first rows, then the rest. */
function* csvChunks<K>(spec: CsvExport<K>, chunkRows: number): Generator<string> {
	let after: K | null = null;
	for (let first = true; ; first = false) {
		const { rows, last } = spec.read(after, chunkRows);
		if (first) yield preamble(spec.comments) + unparseCsv(spec.columns, rows);
		else if (rows.length > 0) yield `\r\n${unparseCsvRows(rows)}`;
		if (rows.length < chunkRows || last === null) return;
		after = last;
	}
}

/** The whole export as text: for tests and for exports known to be small. */
export function csvText<K>(spec: CsvExport<K>, chunkRows = CSV_CHUNK_ROWS): string {
	return [...csvChunks(spec, chunkRows)].join('');
}

/** The export as a streamed download, a chunk per turn of the event loop. */
export function csvStreamDownload<K>(spec: CsvExport<K>, filename: string): Response {
	const chunks = csvChunks(spec, CSV_CHUNK_ROWS);
	const encoder = new TextEncoder();
	const body = streamedBody(
		new ReadableStream<Uint8Array>({
			async pull(controller) {
				await new Promise((resolve) => setImmediate(resolve));
				try {
					const next = chunks.next();
					if (next.done) controller.close();
					else controller.enqueue(encoder.encode(next.value));
				} catch (cause) {
					// The status is sent already: all that is left is to end the download short.
					console.error(`The export ${filename} failed part-way:`, cause);
					controller.error(cause);
				}
			},
			cancel() {
				chunks.return(undefined);
			}
		})
	);
	return new Response(body, { headers: csvHeaders(filename) });
}
