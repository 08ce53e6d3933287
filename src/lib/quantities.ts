import { formatReadNumber, readDecimalText } from './number-reading';
/**
 * Quantities of mass and volume as the app stores, converts, shows and reads them; shared by server
 * and browser, so it holds no server code. Concentrations per litre are the science library's
 * (`toGramsPerLitre`, `fromGramsPerLitre` in chemistry/units.ts).
 *
 * Stored amounts are integers in a named unit (µg, mg or µL) so sums never drift. Conversions here use
 * exact powers of ten from a table rather than mathjs: they run per keystroke in the browser, and
 * dividing by the larger factor keeps 350 mg at exactly 0.35 g.
 */

export const MASS_UNITS = ['µg', 'mg', 'g', 'kg'] as const;
export type MassUnit = (typeof MASS_UNITS)[number];
export const VOLUME_UNITS = ['µL', 'mL', 'L'] as const;
export type VolumeUnit = (typeof VOLUME_UNITS)[number];

const MICROGRAMS_PER: Record<MassUnit, number> = { µg: 1, mg: 1e3, g: 1e6, kg: 1e9 };
const MICROLITRES_PER: Record<VolumeUnit, number> = { µL: 1, mL: 1e3, L: 1e6 };

function convertBy(
	factors: Record<string, number>,
	value: number,
	from: string,
	to: string
): number {
	const ratio = factors[from] / factors[to];
	return ratio >= 1 ? value * ratio : value / (factors[to] / factors[from]);
}

export function convertMass(value: number, from: MassUnit, to: MassUnit): number {
	return convertBy(MICROGRAMS_PER, value, from, to);
}

export function convertVolume(value: number, from: VolumeUnit, to: VolumeUnit): number {
	return convertBy(MICROLITRES_PER, value, from, to);
}

/** A mass as the integer the record keeps in `unit` (µg on batch lines, mg in the stock ledger). */
export function storedMass(value: number, from: MassUnit, unit: 'µg' | 'mg'): number {
	return Math.round(convertMass(value, from, unit));
}

/** A volume as the integer µL the record keeps. */
export function storedVolumeUl(value: number, from: VolumeUnit): number {
	return Math.round(convertVolume(value, from, 'µL'));
}

const trimmed = (n: number, digits: number) => Number(n.toFixed(digits)).toString();
const significant = (n: number, digits: number) => Number(n.toPrecision(digits)).toString();

/**
 * A mass as a bench balance reads it, the one rounding rule of sheets, messages and the browser:
 * below 1 g in mg to 4 significant figures; up to 1 kg in g to the milligram; above in g to 0.1 g.
 */
export function formatMass(value: number, unit: MassUnit): string {
	const ug = convertMass(Math.abs(value), unit, 'µg');
	const sign = value < 0 ? '−' : '';
	const g = convertMass(ug, 'µg', 'g');
	if (g >= 1000) return `${sign}${trimmed(g, 1)} g`;
	if (g >= 1) return `${sign}${trimmed(g, 3)} g`;
	return `${sign}${significant(convertMass(ug, 'µg', 'mg'), 4)} mg`;
}

/**
 * A volume as a pipette or cylinder reads it, the same rule as masses: below 1 mL in µL to 4
 * significant figures; up to 1 L in mL to the microlitre; above in mL to 0.1 mL.
 */
export function formatVolume(value: number, unit: VolumeUnit): string {
	const ul = convertVolume(Math.abs(value), unit, 'µL');
	const sign = value < 0 ? '−' : '';
	const ml = convertVolume(ul, 'µL', 'mL');
	if (ml >= 1000) return `${sign}${trimmed(ml, 1)} mL`;
	if (ml >= 1) return `${sign}${trimmed(ml, 3)} mL`;
	return `${sign}${significant(ul, 4)} µL`;
}

/** A batch's volume in litres, the unit batches are planned and shown in. */
export function batchVolumeL(targetVolumeMl: number): number {
	return convertVolume(targetVolumeMl, 'mL', 'L');
}

export type AmountRead<U extends string> =
	{ ok: true; value: number; unit: U } | { ok: false; message: string };

// The documented units and their usual spellings (the micro sign, the Greek mu or a plain u); any
// other unit is refused rather than converted, so "lb" or "oz" never enters a record.
const UNIT_SPELLINGS: Record<string, MassUnit | VolumeUnit> = {
	kg: 'kg',
	g: 'g',
	mg: 'mg',
	µg: 'µg',
	ug: 'µg',
	μg: 'µg',
	L: 'L',
	l: 'L',
	mL: 'mL',
	ml: 'mL',
	µL: 'µL',
	uL: 'µL',
	ul: 'µL',
	μL: 'µL'
};

/** "12.5 mg" → number text "12.5" and unit text "mg" (none when bare); null without a digit. */
function splitAmount(compact: string): { number: string; unit: string | undefined } | null {
	const match = /^(.*?\d.*?)\s*([a-zA-Zµμ]+)?$/.exec(compact);
	return match ? { number: match[1], unit: match[2] } : null;
}

/** A documented mass or volume unit as typed ("ml", "uL"), or null for anything else. */
export function readQuantityUnit(text: string): MassUnit | VolumeUnit | null {
	return Object.hasOwn(UNIT_SPELLINGS, text.trim()) ? UNIT_SPELLINGS[text.trim()] : null;
}

export function isMassUnit(unit: MassUnit | VolumeUnit): unit is MassUnit {
	return (MASS_UNITS as readonly string[]).includes(unit);
}

/**
 * Reads an amount typed with an optional unit ("12.5", "350 mg", "2.5 mL") through readDecimalText;
 * the unit must be one of `units`, and a bare number is in `defaultUnit`. Zero and below are refused.
 */
export function readAmountText<U extends MassUnit | VolumeUnit>(
	text: string,
	label: string,
	units: readonly U[],
	defaultUnit: U
): AmountRead<U> {
	const compact = text.trim().replace(/\s+/g, ' ');
	const noun = units.includes('g' as U) ? 'mass' : 'volume';
	if (!compact)
		return {
			ok: false,
			message: `${label}: enter the ${noun}${noun === 'mass' ? ' read from the balance' : ''}.`
		};
	const match = splitAmount(compact);
	if (!match)
		return {
			ok: false,
			message: `${label}: “${compact}” is not a ${noun}: type a number such as 12.5 or 12.5 ${defaultUnit}.`
		};
	const unit = match.unit ? readQuantityUnit(match.unit) : defaultUnit;
	if (!unit || !units.includes(unit as U))
		return {
			ok: false,
			message: `${label}: “${match.unit}” is not a ${noun} unit here: use ${units.join(', ')}.`
		};
	const read = readDecimalText(match.number, label);
	if (!read.ok) return read;
	if (read.value <= 0) return { ok: false, message: `${label}: the ${noun} must be above zero.` };
	return { ok: true, value: read.value, unit: unit as U };
}

export type GramsRead =
	{ ok: true; grams: number; readAs: string } | { ok: false; message: string };

/**
 * A level of stock typed in any documented unit ("2 kg", "500", "750 mL"): a bare number is grams,
 * and a volume needs the component's density to become grams. Zero is a level; below is refused.
 */
export function readGramsText(
	text: string,
	label: string,
	densityGPerMl: number | null
): GramsRead {
	const compact = text.trim().replace(/\s+/g, ' ');
	const match = splitAmount(compact);
	if (!match)
		return {
			ok: false,
			message: `${label}: “${compact}” is not an amount; type e.g. 500 g or 2 kg.`
		};
	const unit = match.unit ? readQuantityUnit(match.unit) : 'g';
	if (!unit)
		return {
			ok: false,
			message: `${label}: “${match.unit}” is not a unit here: use ${[...MASS_UNITS, ...VOLUME_UNITS].join(', ')}.`
		};
	const read = readDecimalText(match.number, label);
	if (!read.ok) return read;
	if (read.value < 0) return { ok: false, message: `${label}: the amount cannot be below zero.` };
	if (isMassUnit(unit))
		return {
			ok: true,
			grams: convertMass(read.value, unit, 'g'),
			readAs: `${formatReadNumber(read.value)} ${unit}`
		};
	if (!densityGPerMl)
		return {
			ok: false,
			message: `${label}: a volume needs the component’s density to become a mass; give the density, or the level in g or kg.`
		};
	const grams = convertVolume(read.value, unit, 'mL') * densityGPerMl;
	return {
		ok: true,
		grams,
		readAs: `${formatReadNumber(read.value)} ${unit} = ${formatMass(grams, 'g')} at ${formatReadNumber(densityGPerMl)} g/mL`
	};
}
