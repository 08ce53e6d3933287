import QRCode from 'qrcode';
import type { Lot } from '../db/schema';

/** What a lot label's QR code holds: the internal lot id alone, so any scanner types it as is. */
export function lotQrText(lot: Pick<Lot, 'code'>): string {
	return lot.code;
}

export async function qrSvg(text: string): Promise<string> {
	return QRCode.toString(text, { type: 'svg', errorCorrectionLevel: 'M', margin: 1 });
}
