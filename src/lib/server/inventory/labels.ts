import QRCode from 'qrcode';
import type { Lot } from '../db/schema';

/** What a lot label's QR code holds: the internal lot id alone, so any scanner types it as is. */
export function lotQrText(lot: Pick<Lot, 'code'>): string {
	return lot.code;
}

export async function qrSvg(text: string): Promise<string> {
	return QRCode.toString(text, { type: 'svg', errorCorrectionLevel: 'M', margin: 1 });
}

// Where a stored text came from, "(common practice)" or "(from memory; …)", is for the person
// reading it on screen; a physical label has no room for it and the bench has no use for it.
const SOURCE_NOTE = /\s*\((?:common practice|from memory)\b[^()]*\)/gi;

/** The text as printed on a label: source notes in brackets taken out, other brackets kept. */
export function withoutSourceNotes(text: string): string {
	return text.replace(SOURCE_NOTE, '').trim();
}
