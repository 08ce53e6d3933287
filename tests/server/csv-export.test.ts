// Site-sized exports stream a keyset chunk at a time: the text is the same as one whole unparse
// (papaparse, read back independently), the server keeps turning between chunks, and the
// compression hook compresses the stream without reading it whole first.
import { brotliDecompressSync } from 'node:zlib';
import type { RequestEvent } from '@sveltejs/kit';
import Papa from 'papaparse';
import { describe, expect, it, vi } from 'vitest';
import { handleCompression } from '$lib/server/compression';
import { unparseCsv } from '$lib/server/csv';
import { csvStreamDownload, csvText, type CsvExport } from '$lib/server/csv-export';

const ROWS = 10_001;
const columns = ['n', 'name', 'note'];
const row = (n: number) => [n, `item ${n}`, n % 1000 === 0 ? '=HYPERLINK("x")' : 'plain, "quoted"'];

/** Rows 1 … ROWS, keyed by n, as a keyset reader would give them. */
function numbered(reads: number[] = []): CsvExport<number> {
	return {
		columns,
		comments: ['Numbered rows', 'second line'],
		read: (after, limit) => {
			reads.push(after ?? 0);
			const from = (after ?? 0) + 1;
			const to = Math.min(ROWS, from + limit - 1);
			const rows =
				from > ROWS ? [] : Array.from({ length: to - from + 1 }, (_, i) => row(from + i));
			return { rows, last: rows.length ? to : null };
		}
	};
}

const whole = `# Numbered rows\r\n# second line\r\n${unparseCsv(
	columns,
	Array.from({ length: ROWS }, (_, i) => row(i + 1))
)}`;

describe('CSV exports read by keyset chunks', () => {
	it('writes the same text as one unparse of every row, whatever the chunk size', () => {
		const reads: number[] = [];
		expect(csvText(numbered(reads), 2000)).toBe(whole);
		// 10,001 rows in chunks of 2,000: six reads, each after the last key of the one before.
		expect(reads).toEqual([0, 2000, 4000, 6000, 8000, 10_000]);
		expect(csvText(numbered(), 10_001)).toBe(whole);
		expect(csvText(numbered(), 7)).toBe(whole);
		const parsed = Papa.parse<string[]>(whole, { comments: '#', skipEmptyLines: true });
		expect(parsed.data).toHaveLength(ROWS + 1);
		expect(parsed.data[1000][2]).toBe(`'=HYPERLINK("x")`);
	});

	it('streams the download compressed, turning the event loop between chunks', async () => {
		let turns = 0;
		const ticker = setInterval(() => turns++, 0);
		const event = {
			request: new Request('http://127.0.0.1/lots/ledger.csv', {
				headers: { 'accept-encoding': 'br' }
			})
		} as unknown as RequestEvent;
		const response = await handleCompression({
			event,
			resolve: async () => csvStreamDownload(numbered(), 'numbered.csv')
		});
		expect(response.headers.get('content-encoding')).toBe('br');
		expect(response.headers.get('content-disposition')).toBe('attachment; filename="numbered.csv"');
		const bytes = Buffer.from(await response.arrayBuffer());
		clearInterval(ticker);
		expect(brotliDecompressSync(bytes).toString()).toBe(whole);
		expect(turns).toBeGreaterThan(0);
	});

	it('ends a download short when a chunk fails, and the server goes on', async () => {
		// A full first chunk, then a read that fails.
		const failing: CsvExport<number> = {
			columns,
			read: (after, limit) => {
				if (after !== null) throw new Error('the disk went away');
				return { rows: Array.from({ length: limit }, (_, i) => row(i + 1)), last: limit };
			}
		};
		const event = {
			request: new Request('http://127.0.0.1/lots/export.csv', {
				headers: { 'accept-encoding': 'gzip' }
			})
		} as unknown as RequestEvent;
		const errors = vi.spyOn(console, 'error').mockImplementation(() => {});
		const response = await handleCompression({
			event,
			resolve: async () => csvStreamDownload(failing, 'x.csv')
		});
		await expect(response.arrayBuffer()).rejects.toThrow();
		expect(errors).toHaveBeenCalled();
		errors.mockRestore();
	});
});
