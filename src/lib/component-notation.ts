import { readDecimalText, storedNumberText } from './number-reading';
/**
 * The short text notations a component's lists are typed in, on the form and in CSV files alike:
 *   fractions   C=0.39; N=0.105          (g element per g)
 *   ions        2 Na+; HPO4^2-           (count, then the ion label with its charge)
 *   solubility  25:360; 0:357            (°C : g per L water)
 *   hazards     H302; H319: text          (GHS code, text optional when the code is known)
 * Shared by server and browser, so it holds no server code.
 */
export type Parsed<T> = { ok: true; value: T } | { ok: false; error: string };

function items(text: string): string[] {
	return text
		.split(/[;\n]/)
		.map((s) => s.trim())
		.filter(Boolean);
}

function numberFrom(text: string): number | null {
	const read = readDecimalText(text, 'Number');
	return read.ok ? read.value : null;
}

export function parseFractions(text: string): Parsed<Record<string, number> | null> {
	const out: Record<string, number> = {};
	for (const item of items(text)) {
		const match = /^([A-Z][a-z]?)\s*[=:]\s*(.+)$/.exec(item);
		const value = match ? numberFrom(match[2]) : null;
		if (!match || value === null) {
			return { ok: false, error: `“${item}” is not an element fraction; write it as C=0.39.` };
		}
		if (value < 0 || value > 1)
			return {
				ok: false,
				error: `${match[1]}: a fraction is between 0 and 1 g per g, not ${value}.`
			};
		if (match[1] in out) return { ok: false, error: `${match[1]} is given twice.` };
		out[match[1]] = value;
	}
	const sum = Object.values(out).reduce((a, b) => a + b, 0);
	if (sum > 1 + 1e-6)
		return { ok: false, error: `The fractions add up to ${sum.toFixed(3)}, more than 1 g per g.` };
	return { ok: true, value: Object.keys(out).length ? out : null };
}

export function formatFractions(value: Record<string, number> | null | undefined): string {
	return value
		? Object.entries(value)
				.map(([s, f]) => `${s}=${storedNumberText(f)}`)
				.join('; ')
		: '';
}

export interface IonEntry {
	ion: string;
	count: number;
	charge: number;
}

export function parseIons(text: string): Parsed<IonEntry[] | null> {
	const out: IonEntry[] = [];
	for (const item of items(text)) {
		const match = /^(?:(\d+(?:\.\d+)?)\s*[x×*]?\s+)?(\S+?)(?:\^(\d+))?([+-])$/.exec(item);
		if (!match) {
			return {
				ok: false,
				error: `“${item}” is not an ion; write it as 2 Na+ or HPO4^2- (count, label, charge).`
			};
		}
		const count = match[1] ? Number(match[1]) : 1;
		const magnitude = match[3] ? Number(match[3]) : 1;
		out.push({
			ion: `${match[2]}${match[3] ? `^${match[3]}` : ''}${match[4]}`,
			count,
			charge: match[4] === '+' ? magnitude : -magnitude
		});
	}
	if (out.length === 0) return { ok: true, value: null };
	const net = out.reduce((sum, i) => sum + i.count * i.charge, 0);
	if (Math.abs(net) > 1e-9)
		return { ok: false, error: `The ions carry a net charge of ${net}; a salt must be neutral.` };
	return { ok: true, value: out };
}

export function formatIons(value: IonEntry[] | null | undefined): string {
	return value ? value.map((i) => (i.count === 1 ? i.ion : `${i.count} ${i.ion}`)).join('; ') : '';
}

export interface SolubilityEntry {
	temperatureC: number;
	gPerL: number;
}

export function parseSolubility(text: string): Parsed<SolubilityEntry[] | null> {
	const out: SolubilityEntry[] = [];
	for (const item of items(text)) {
		const match = /^(.+?)\s*(?:°\s*C)?\s*:\s*(.+?)\s*(?:g\s*\/\s*L)?$/i.exec(item);
		const temperatureC = match ? numberFrom(match[1]) : null;
		const gPerL = match ? numberFrom(match[2]) : null;
		if (temperatureC === null || gPerL === null) {
			return {
				ok: false,
				error: `“${item}” is not a solubility point; write it as 25:360 (°C : g per L water).`
			};
		}
		if (temperatureC < -20 || temperatureC > 150)
			return { ok: false, error: `${temperatureC} °C is outside −20 to 150 °C.` };
		if (!(gPerL > 0)) return { ok: false, error: `A solubility is more than 0 g/L, not ${gPerL}.` };
		if (out.some((p) => p.temperatureC === temperatureC))
			return { ok: false, error: `${temperatureC} °C is given twice.` };
		out.push({ temperatureC, gPerL });
	}
	return {
		ok: true,
		value: out.length ? out.sort((a, b) => a.temperatureC - b.temperatureC) : null
	};
}

export function formatSolubility(value: SolubilityEntry[] | null | undefined): string {
	return value ? value.map((p) => `${p.temperatureC}:${storedNumberText(p.gPerL)}`).join('; ') : '';
}

export interface HazardEntry {
	code: string;
	text: string;
}

export function parseHazards(
	text: string,
	known: Readonly<Record<string, string>>
): Parsed<HazardEntry[]> {
	const out: HazardEntry[] = [];
	for (const item of items(text)) {
		const match = /^(EUH\d{3}|H\d{3}[A-Za-z]{0,2})(?:\s*[:\-–]\s*(.+)|\s+(.+))?$/.exec(item);
		if (!match)
			return {
				ok: false,
				error: `“${item}” is not a GHS hazard statement; write it as H319 or H319: its text.`
			};
		const code = match[1];
		const textPart = (match[2] ?? match[3] ?? '').trim() || known[code];
		if (!textPart)
			return { ok: false, error: `${code} is not a code we know; give its text too (${code}: …).` };
		if (out.some((h) => h.code === code)) return { ok: false, error: `${code} is given twice.` };
		out.push({ code, text: textPart });
	}
	return { ok: true, value: out };
}

export function formatHazards(value: HazardEntry[] | null | undefined): string {
	return value ? value.map((h) => `${h.code}: ${h.text}`).join('; ') : '';
}

/** CAS registry numbers end in a check digit: Σ(position × digit) mod 10 over the other digits, from the right. */
export function checkCasNumber(text: string): string | null {
	const match = /^(\d{2,7})-(\d{2})-(\d)$/.exec(text.trim());
	if (!match) return 'A CAS number looks like 7647-14-5.';
	const digits = (match[1] + match[2]).split('').reverse();
	const sum = digits.reduce((s, d, i) => s + (i + 1) * Number(d), 0);
	return sum % 10 === Number(match[3])
		? null
		: `The check digit of ${text.trim()} is wrong; look at the number again.`;
}
