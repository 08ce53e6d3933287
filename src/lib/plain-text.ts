/**
 * Control characters (C0, DEL, C1) and invisible format characters, which include the
 * bidirectional overrides and isolates (U+202A–U+202E, U+2066–U+2069, U+200E/F, U+061C) and
 * zero-width characters: in a name a person reads, they hide or reorder what it says
 * ("invoice‮fdp.exe" shows as "invoiceexe.pdf").
 */
const INVISIBLE_OR_CONTROL = /[\p{Cc}\p{Cf}]/gu;

/** A name someone sent, as plain visible text: line breaks and tabs become spaces, the rest goes. */
export function visibleText(text: string): string {
	return text.replace(/[\r\n\t]+/g, ' ').replace(INVISIBLE_OR_CONTROL, '');
}
