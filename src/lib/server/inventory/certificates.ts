import { createHash, randomBytes } from 'node:crypto';
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { asc, eq } from 'drizzle-orm';
import { recordAudit, type Actor } from '../audit';
import { config } from '../config';
import { db, type Db } from '../db';
import { lot, lotCertificate, type LotCertificate } from '../db/schema';
import { RuleError } from '../rule-error';
import { visibleText } from '$lib/plain-text';

export const MAX_CERTIFICATE_BYTES = 10 * 1024 * 1024;
export const MAX_CERTIFICATES_PER_UPLOAD = 10;

const SIGNATURES: { mediaType: string; extension: string; label: string; bytes: number[] }[] = [
	{
		mediaType: 'application/pdf',
		extension: 'pdf',
		label: 'PDF',
		bytes: [0x25, 0x50, 0x44, 0x46, 0x2d]
	},
	{
		mediaType: 'image/png',
		extension: 'png',
		label: 'PNG',
		bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]
	},
	{ mediaType: 'image/jpeg', extension: 'jpg', label: 'JPEG', bytes: [0xff, 0xd8, 0xff] }
];

/** The type a file really is, from its first bytes; the name and the browser's claim are not trusted. */
export function sniffMediaType(bytes: Uint8Array): { mediaType: string; extension: string } | null {
	const match = SIGNATURES.find((s) => s.bytes.every((b, i) => bytes[i] === b));
	return match ? { mediaType: match.mediaType, extension: match.extension } : null;
}

/**
 * A name safe to show and to offer in Content-Disposition: no folders, no control characters, no
 * quotes, a bounded length. It is never used as a path.
 */
export function cleanDisplayName(name: string, extension: string): string {
	const base = name.split(/[\\/]/).pop() ?? '';
	let cleaned = visibleText(base)
		.normalize('NFKC')
		.replace(/["'`<>|:*?;]/g, '')
		.replace(/\s+/g, ' ')
		.replace(/^[.\s]+/, '')
		.trim()
		.slice(0, 120);
	if (!cleaned) cleaned = 'certificate';
	if (
		!cleaned.toLowerCase().endsWith(`.${extension}`) &&
		!(extension === 'jpg' && /\.jpe?g$/i.test(cleaned))
	)
		cleaned += `.${extension}`;
	return cleaned;
}

export interface CheckedUpload {
	bytes: Uint8Array;
	displayName: string;
	mediaType: string;
	extension: string;
	sizeBytes: number;
	sha256: string;
}

/** Checks one uploaded file; the message says exactly why a file is refused. */
export async function checkCertificateFile(
	file: File,
	field = 'certificates'
): Promise<CheckedUpload> {
	const shownName = visibleText(file.name.split(/[\\/]/).pop() ?? '') || 'the file';
	if (file.size === 0) throw new RuleError(`“${shownName}” is empty.`, { field });
	if (file.size > MAX_CERTIFICATE_BYTES) {
		throw new RuleError(
			`“${shownName}” is ${(file.size / 1024 / 1024).toFixed(1)} MB; certificates may be up to 10 MB.`,
			{ field }
		);
	}
	const bytes = new Uint8Array(await file.arrayBuffer());
	const type = sniffMediaType(bytes);
	if (!type) {
		throw new RuleError(
			`“${shownName}” is not a PDF, PNG or JPEG file (judged from its contents, not its name); it was not stored.`,
			{ field }
		);
	}
	return {
		bytes,
		displayName: cleanDisplayName(file.name, type.extension),
		mediaType: type.mediaType,
		extension: type.extension,
		sizeBytes: bytes.length,
		sha256: createHash('sha256').update(bytes).digest('hex')
	};
}

/** The non-empty files of a multi-file input, each checked; any bad file refuses them all. */
export async function checkCertificateFiles(
	formData: FormData,
	field = 'certificates'
): Promise<CheckedUpload[]> {
	const files = formData
		.getAll(field)
		.filter((f): f is File => f instanceof File && (f.size > 0 || f.name !== ''));
	if (files.length > MAX_CERTIFICATES_PER_UPLOAD)
		throw new RuleError(`Upload at most ${MAX_CERTIFICATES_PER_UPLOAD} files at once.`, { field });
	const checked: CheckedUpload[] = [];
	for (const file of files) checked.push(await checkCertificateFile(file, field));
	return checked;
}

function certificatesFolder(): string {
	const folder = join(config.uploadsFolder, 'certificates');
	mkdirSync(folder, { recursive: true });
	return folder;
}

/** Writes the files under random names; returns the names so a failed transaction can remove them. */
export function writeCertificateFiles(uploads: CheckedUpload[]): string[] {
	const folder = certificatesFolder();
	const written: string[] = [];
	try {
		for (const upload of uploads) {
			const storedName = `${randomBytes(18).toString('hex')}.${upload.extension}`;
			writeFileSync(join(folder, storedName), upload.bytes, { flag: 'wx' });
			written.push(storedName);
		}
	} catch (cause) {
		removeCertificateFiles(written);
		throw cause;
	}
	return written;
}

export function removeCertificateFiles(storedNames: string[]): void {
	const folder = certificatesFolder();
	for (const name of storedNames) rmSync(join(folder, name), { force: true });
}

type Writer = Pick<Db, 'insert'>;

export function insertCertificateRows(
	writer: Writer,
	lotId: string,
	uploadedById: string,
	uploads: CheckedUpload[],
	storedNames: string[]
): void {
	uploads.forEach((upload, i) => {
		writer
			.insert(lotCertificate)
			.values({
				lotId,
				storedName: storedNames[i],
				displayName: upload.displayName,
				mediaType: upload.mediaType,
				sizeBytes: upload.sizeBytes,
				sha256: upload.sha256,
				uploadedById
			})
			.run();
	});
}

/** Adds certificates to an existing lot: files first, then rows and audit in one transaction. */
export function attachCertificates(
	actor: Actor & { id: string },
	lotId: string,
	uploads: CheckedUpload[]
): number {
	if (uploads.length === 0)
		throw new RuleError('Choose at least one file to upload.', { field: 'certificates' });
	const found = db.select({ id: lot.id, code: lot.code }).from(lot).where(eq(lot.id, lotId)).get();
	if (!found) throw new RuleError('No lot with this id.', { status: 404 });
	const stored = writeCertificateFiles(uploads);
	try {
		db.transaction((tx) => {
			insertCertificateRows(tx, lotId, actor.id, uploads, stored);
			recordAudit(
				actor,
				{
					action: 'lot.certificate_added',
					subjectType: 'lot',
					subjectId: lotId,
					detail: { code: found.code, files: uploads.map((u) => u.displayName) }
				},
				tx
			);
		});
	} catch (cause) {
		removeCertificateFiles(stored);
		throw cause;
	}
	return uploads.length;
}

export function certificatesOf(lotId: string): LotCertificate[] {
	return db
		.select()
		.from(lotCertificate)
		.where(eq(lotCertificate.lotId, lotId))
		.orderBy(asc(lotCertificate.uploadedAt))
		.all();
}

export function findCertificate(lotId: string, certificateId: string): LotCertificate | undefined {
	const row = db.select().from(lotCertificate).where(eq(lotCertificate.id, certificateId)).get();
	return row && row.lotId === lotId ? row : undefined;
}

export function readCertificateBytes(row: LotCertificate): Buffer {
	// The stored name is ours (random hex + extension); check it anyway before touching the disk.
	if (!/^[0-9a-f]{36}\.(pdf|png|jpg)$/.test(row.storedName))
		throw new RuleError('This certificate cannot be read.', { status: 404 });
	try {
		return readFileSync(join(certificatesFolder(), row.storedName));
	} catch {
		throw new RuleError('The file of this certificate is missing from the uploads folder.', {
			status: 404
		});
	}
}

/** Content-Disposition with an ASCII fallback and the UTF-8 name (RFC 6266 / RFC 5987). */
export function contentDisposition(
	displayName: string,
	disposition: 'inline' | 'attachment' = 'attachment'
): string {
	const ascii = displayName.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
	return `${disposition}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(displayName)}`;
}
