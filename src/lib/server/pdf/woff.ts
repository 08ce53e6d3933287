import { inflateSync } from 'node:zlib';

// WOFF 1.0 (W3C Recommendation, 13 December 2012): a 44-byte header, then 20 bytes per table
// (tag, offset, compressed length, original length, checksum), each table zlib-compressed when
// that made it smaller. An sfnt (TrueType) file: a 12-byte offset table, 16 bytes per table
// (tag, checksum, offset, length), then the tables, each padded to 4 bytes.
const WOFF_SIGNATURE = 0x774f4646; // 'wOFF'
const WOFF_HEADER_BYTES = 44;
const WOFF_ENTRY_BYTES = 20;
const SFNT_HEADER_BYTES = 12;
const SFNT_ENTRY_BYTES = 16;

interface Table {
	tag: number;
	checksum: number;
	data: Buffer;
}

function readTables(woff: Buffer, count: number): Table[] {
	return Array.from({ length: count }, (_, i) => {
		const at = WOFF_HEADER_BYTES + i * WOFF_ENTRY_BYTES;
		const offset = woff.readUInt32BE(at + 4);
		const compressed = woff.readUInt32BE(at + 8);
		const original = woff.readUInt32BE(at + 12);
		const stored = woff.subarray(offset, offset + compressed);
		return {
			tag: woff.readUInt32BE(at),
			checksum: woff.readUInt32BE(at + 16),
			data: compressed < original ? inflateSync(stored) : stored
		};
	});
}

/**
 * The plain TrueType font inside a WOFF file. Embedding it instead of the WOFF spares the PDF
 * library from inflating every table again in pure JavaScript for each document (slow).
 */
export function convertWoffToSfnt(woffBytes: Uint8Array): Uint8Array {
	const woff = Buffer.from(woffBytes.buffer, woffBytes.byteOffset, woffBytes.byteLength);
	if (woff.readUInt32BE(0) !== WOFF_SIGNATURE) throw new Error('Not a WOFF font file.');
	const count = woff.readUInt16BE(12);
	const tables = readTables(woff, count);
	const padded = (n: number) => (n + 3) & ~3;
	const dataStart = SFNT_HEADER_BYTES + count * SFNT_ENTRY_BYTES;
	const size = tables.reduce((sum, t) => sum + padded(t.data.length), dataStart);
	const sfnt = Buffer.alloc(size);
	const entrySelector = Math.floor(Math.log2(count));
	const searchRange = 2 ** entrySelector * 16;
	sfnt.writeUInt32BE(woff.readUInt32BE(4), 0);
	sfnt.writeUInt16BE(count, 4);
	sfnt.writeUInt16BE(searchRange, 6);
	sfnt.writeUInt16BE(entrySelector, 8);
	sfnt.writeUInt16BE(count * 16 - searchRange, 10);
	let offset = dataStart;
	tables.forEach((table, i) => {
		const at = SFNT_HEADER_BYTES + i * SFNT_ENTRY_BYTES;
		sfnt.writeUInt32BE(table.tag, at);
		sfnt.writeUInt32BE(table.checksum, at + 4);
		sfnt.writeUInt32BE(offset, at + 8);
		sfnt.writeUInt32BE(table.data.length, at + 12);
		table.data.copy(sfnt, offset);
		offset += padded(table.data.length);
	});
	return new Uint8Array(sfnt.buffer, sfnt.byteOffset, sfnt.byteLength);
}
