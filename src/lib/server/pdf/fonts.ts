import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import fontkit from '@pdf-lib/fontkit';
import type { PDFDocument, PDFFont } from 'pdf-lib';
import { convertWoffToSfnt } from './woff';

/**
 * The app's typeface in PDFs: Lexend, as the pages use it (@fontsource/lexend). Its latin subset
 * holds µ (U+00B5), · ² ³ ± ° × – — − and the quotes; no subset holds Greek μ, ≤, ≥ or →, which
 * text-fit.ts spells (μ as µ, ≤ as <=, ≥ as >=, → as ->).
 */
const LEXEND_FILES = {
	regular: '@fontsource/lexend/files/lexend-latin-400-normal.woff',
	bold: '@fontsource/lexend/files/lexend-latin-600-normal.woff'
} as const;

export interface PdfFonts {
	font: PDFFont;
	bold: PDFFont;
}

let lexendBytes: Promise<{ regular: Uint8Array; bold: Uint8Array }> | null = null;

/** The fonts as plain TrueType, read and unpacked once per process. */
function readLexend(): Promise<{ regular: Uint8Array; bold: Uint8Array }> {
	if (!lexendBytes) {
		const require = createRequire(import.meta.url);
		const read = async (file: string) => convertWoffToSfnt(await readFile(require.resolve(file)));
		lexendBytes = Promise.all([read(LEXEND_FILES.regular), read(LEXEND_FILES.bold)]).then(
			([regular, bold]) => ({ regular, bold })
		);
		lexendBytes.catch(() => (lexendBytes = null));
	}
	return lexendBytes;
}

/** Lexend regular and semibold embedded in `doc`, each only with the glyphs the document draws. */
export async function embedLexend(doc: PDFDocument): Promise<PdfFonts> {
	const bytes = await readLexend();
	doc.registerFontkit(fontkit);
	const [font, bold] = await Promise.all([
		doc.embedFont(bytes.regular, { subset: true }),
		doc.embedFont(bytes.bold, { subset: true })
	]);
	return { font, bold };
}
