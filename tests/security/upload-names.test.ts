// Names of uploaded files are shown to people and written to the trail: control, bidirectional
// and zero-width characters are removed so a name cannot hide or reorder what it says.
import { describe, expect, it } from 'vitest';
import { visibleText } from '$lib/plain-text';
import { checkUploadFile } from '$lib/simulation/run-data';
import { checkCertificateFile, cleanDisplayName } from '$lib/server/inventory/certificates';

// The explicit directional formatting characters of Unicode Standard Annex #9 (Table 2): embeddings
// and overrides U+202A–U+202E, isolates U+2066–U+2069, and the marks U+200E, U+200F, U+061C.
const BIDI_CONTROLS = [
	'\u202a',
	'\u202b',
	'\u202c',
	'\u202d',
	'\u202e',
	'\u2066',
	'\u2067',
	'\u2068',
	'\u2069',
	'\u200e',
	'\u200f',
	'\u061c'
];
// Zero-width space, joiners, byte-order mark; C0 NUL and ESC, DEL, and C1 NEL.
const OTHER_INVISIBLES = [
	'\u200b',
	'\u200c',
	'\u200d',
	'\ufeff',
	'\u0000',
	'\u001b',
	'\u007f',
	'\u0085'
];

const PDF_BYTES = new TextEncoder().encode(
	'%PDF-1.4\n%âãÏÓ\n1 0 obj\n<<>>\nendobj\ntrailer\n<<>>\n%%EOF\n'
);

describe('upload names', () => {
	it.each([...BIDI_CONTROLS, ...OTHER_INVISIBLES].map((c) => [c.codePointAt(0)!.toString(16), c]))(
		'removes U+%s',
		(_, character) => {
			expect(visibleText(`lot${character}cert.pdf`)).toBe('lotcert.pdf');
		}
	);

	it('turns line breaks and tabs into spaces and keeps letters of every script', () => {
		expect(visibleText('Zertifikat\r\nä\tΑβγ 証明書.pdf')).toBe('Zertifikat ä Αβγ 証明書.pdf');
	});

	it('stores a certificate named with a right-to-left override as plain text', async () => {
		// Shown as "certificatefdp.exe" reversed: "certificateexe.pdf" would pretend to be a PDF.
		const tricky = 'certificate\u202efdp.exe.pdf';
		expect(cleanDisplayName(tricky, 'pdf')).toBe('certificatefdp.exe.pdf');
		const checked = await checkCertificateFile(new File([PDF_BYTES], tricky));
		expect(checked.displayName).toBe('certificatefdp.exe.pdf');
		expect(checked.displayName).not.toMatch(/[\p{Cc}\p{Cf}]/u);
	});

	it('names a refused run file without its hidden characters', () => {
		const refusal = checkUploadFile({ name: 'run\u202etxt.exe', size: 10, type: 'text/plain' });
		expect(refusal).toBe('“runtxt.exe” is not a .csv, .tsv or .txt file.');
	});
});
