/**
 * Concentration units. Conversions go through a private mathjs instance (so the global one is not
 * altered); each unit's factor is worked out once and cached, because a mathjs conversion costs tens
 * of microseconds and a composition converts every line.
 */
import { all, create } from 'mathjs';
import { ChemistryInputError } from './errors';
import { readMolarMass } from './input';

export const CONCENTRATION_UNITS = ['g/L', 'mg/L', 'µg/L', 'M', 'mM', 'µM', '% w/v'] as const;
export type ConcentrationUnit = (typeof CONCENTRATION_UNITS)[number];

const math = create(all, {});
math.createUnit('M', { definition: '1 mol/L', prefixes: 'short' });
// % w/v is grams per 100 mL.
math.createUnit('percentWV', { definition: '1 g/dL' });

const MATHJS_NAMES: Record<ConcentrationUnit, string> = {
	'g/L': 'g/L',
	'mg/L': 'mg/L',
	'µg/L': 'ug/L',
	M: 'M',
	mM: 'mM',
	µM: 'uM',
	'% w/v': 'percentWV'
};

const ALIASES: Record<string, ConcentrationUnit> = {
	'g/l': 'g/L',
	'mg/l': 'mg/L',
	'ug/l': 'µg/L',
	m: 'M',
	'mol/l': 'M',
	mm: 'mM',
	'mmol/l': 'mM',
	um: 'µM',
	'umol/l': 'µM',
	'%w/v': '% w/v',
	'%(w/v)': '% w/v',
	'%wv': '% w/v'
};

function aliasKey(text: string): string {
	return text.replace(/\s+/g, '').replace(/[µμ]/g, 'u').toLowerCase();
}

/**
 * The unit as one of CONCENTRATION_UNITS. Case matters only where it carries meaning: `mM` is
 * millimolar, and `mm`/`MM` are refused rather than guessed.
 */
const normalizedCache = new Map<string, ConcentrationUnit>();

export function normalizeConcentrationUnit(text: string, field = 'unit'): ConcentrationUnit {
	const cached = typeof text === 'string' ? normalizedCache.get(text) : undefined;
	if (cached) return cached;
	if (typeof text !== 'string' || text.trim() === '') {
		throw new ChemistryInputError(
			`A unit is required; use one of ${CONCENTRATION_UNITS.join(', ')}`,
			{ field }
		);
	}
	const compact = text.replace(/\s+/g, '').replace(/[µμ]/g, 'u');
	const key = aliasKey(text);
	const molar = /^(m|u)?M$|^(m|u)?mol\/[lL]$/.test(compact);
	const found = ALIASES[key];
	if (found && (!['M', 'mM', 'µM'].includes(found) || molar)) {
		if (normalizedCache.size < 1000) normalizedCache.set(text, found);
		return found;
	}
	throw new ChemistryInputError(
		`Unknown concentration unit '${text}'; use one of ${CONCENTRATION_UNITS.join(', ')}`,
		{ field }
	);
}

export function isMolarUnit(unit: ConcentrationUnit): boolean {
	return unit === 'M' || unit === 'mM' || unit === 'µM';
}

const factorCache = new Map<ConcentrationUnit, number>();

/** g/L per unit for mass units, mol/L per unit for molar ones. */
function baseFactorOf(unit: ConcentrationUnit): number {
	let factor = factorCache.get(unit);
	if (factor === undefined) {
		factor = math.unit(1, MATHJS_NAMES[unit]).toNumber(isMolarUnit(unit) ? 'mol/L' : 'g/L');
		factorCache.set(unit, factor);
	}
	return factor;
}

function checkMolarMass(
	molarMassGPerMol: number | null | undefined,
	unit: ConcentrationUnit,
	field: string
): number {
	if (molarMassGPerMol == null) {
		throw new ChemistryInputError(
			`A concentration in ${unit} needs a formula or molar mass; use a mass unit such as g/L`,
			{
				field
			}
		);
	}
	return readMolarMass(molarMassGPerMol, field);
}

/** Checks an amount: finite and positive (zero only when `allowZero`). */
export function checkAmount(amount: number, field = 'amount', allowZero = false): number {
	if (typeof amount !== 'number' || !Number.isFinite(amount)) {
		throw new ChemistryInputError('Amount must be a finite number', { field });
	}
	if (amount < 0 || (amount === 0 && !allowZero)) {
		throw new ChemistryInputError(
			`Amount must be ${allowZero ? 'zero or more' : 'greater than zero'}, not ${amount}`,
			{
				field
			}
		);
	}
	return amount;
}

/**
 * Converts a concentration to g/L. A molar unit needs the molar mass of the form the amount refers to.
 * `field` names the amount; unit errors name `unitField`.
 */
export function toGramsPerLitre(
	amount: number,
	unit: string,
	molarMassGPerMol?: number | null,
	field = 'amount',
	unitField = 'unit'
): number {
	checkAmount(amount, field);
	const normalized = normalizeConcentrationUnit(unit, unitField);
	const factor = baseFactorOf(normalized);
	if (!isMolarUnit(normalized)) return amount * factor;
	return amount * factor * checkMolarMass(molarMassGPerMol, normalized, unitField);
}

/** Converts g/L to the given unit (molar units need the molar mass). */
export function fromGramsPerLitre(
	gPerL: number,
	unit: string,
	molarMassGPerMol?: number | null,
	unitField = 'unit'
): number {
	checkAmount(gPerL, 'gPerL', true);
	const normalized = normalizeConcentrationUnit(unit, unitField);
	const factor = baseFactorOf(normalized);
	if (!isMolarUnit(normalized)) return gPerL / factor;
	return gPerL / checkMolarMass(molarMassGPerMol, normalized, unitField) / factor;
}

export function convertConcentration(
	amount: number,
	fromUnit: string,
	toUnit: string,
	molarMassGPerMol?: number | null
): number {
	checkAmount(amount, 'amount', true);
	const from = normalizeConcentrationUnit(fromUnit, 'fromUnit');
	const to = normalizeConcentrationUnit(toUnit, 'toUnit');
	// Molar to molar and mass to mass need no molar mass.
	if (isMolarUnit(from) === isMolarUnit(to))
		return (amount * baseFactorOf(from)) / baseFactorOf(to);
	const gPerL = isMolarUnit(from)
		? amount * baseFactorOf(from) * checkMolarMass(molarMassGPerMol, from, 'fromUnit')
		: amount * baseFactorOf(from);
	return fromGramsPerLitre(gPerL, to, molarMassGPerMol, 'toUnit');
}

/** Exact by the definition of the hour. */
export const SECONDS_PER_HOUR = 3600;

/** 0 °C in kelvin, exact by the definition of the Celsius scale (SI Brochure, 9th ed., 2.3.1). */
export const ZERO_CELSIUS_K = 273.15;

/** Absolute temperature from degrees Celsius. */
export function toKelvin(temperatureC: number): number {
	return temperatureC + ZERO_CELSIUS_K;
}
