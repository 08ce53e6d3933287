/**
 * Dissolved-oxygen saturation, oxygen transfer and uptake.
 *
 * Saturation C* is for water in equilibrium with a water-saturated gas at total pressure P whose dry
 * part holds O2 at mole fraction x. Both fits give C* for moist air at 1 atm; the APHA/USGS correction
 * (APHA Standard Methods 4500-O, as also used by the USGS) takes it to P, and because C* is proportional to the O2 partial pressure in the dry gas (Henry's law), another O2
 * content scales it by x / x_air at the same total pressure: C*(x) = C*_air · x / x_air, with
 * x_air = AIR_O2_MOLE_FRACTION = 0.20946 (data/oxygen-solubility.ts).
 */
import { ChemistryInputError } from './errors';
import { joinField, readFinite, readNonNegative, readPositive } from './input';
import { molarMassOf } from './formula';
import { toKelvin } from './units';
import {
	AIR_O2_MOLE_FRACTION,
	APHA_PRESSURE_CORRECTION,
	BENSON_KRAUSE_APHA,
	GARCIA_GORDON_COMBINED,
	KPA_PER_ATM,
	SEAWATER_DENSITY_MILLERO_POISSON
} from './data/oxygen-solubility';

/** g/mol of O2 from IUPAC 2021 atomic weights (2 × 15.999 = 31.998). */
export const O2_MOLAR_MASS_G_PER_MOL = molarMassOf({ O: 2 });

export type OxygenSolubilityMethod = 'benson-krause-1984' | 'garcia-gordon-1992';

export interface ValidRange {
	temperatureC: [number, number];
	salinityGPerKg: [number, number];
	source: string;
}

export const OXYGEN_SOLUBILITY_RANGES: Readonly<Record<OxygenSolubilityMethod, ValidRange>> = {
	// 0–50 °C is the span APHA 4500-O tabulates; the salinity bound is the APHA table's (from memory).
	'benson-krause-1984': {
		temperatureC: [0, 50],
		salinityGPerKg: [0, 45],
		source: 'Benson & Krause (1984) as used by APHA Standard Methods 4500-O'
	},
	'garcia-gordon-1992': {
		temperatureC: [-2, 40],
		salinityGPerKg: [0, 42],
		source: 'Garcia & Gordon (1992) combined fit'
	}
};

/** Highest total pressure accepted: the ideal-gas pressure scaling is not meant for more. */
export const MAX_PRESSURE_KPA = 10 * KPA_PER_ATM;

export interface OxygenSaturationInput {
	temperatureC: number;
	/** Salinity in g/kg (≈ practical salinity); 0 for fresh water. */
	salinityGPerKg?: number;
	/** Total pressure of the gas over the liquid, kPa. Default 101.325. */
	pressureKPa?: number;
	/** O2 mole fraction of the dry gas; default air, 0.20946. */
	o2MoleFraction?: number;
	method?: OxygenSolubilityMethod;
}

export interface OxygenSaturationResult {
	mgPerL: number;
	mmolPerL: number;
	/** Native Garcia–Gordon basis; only for that method. */
	umolPerKg?: number;
	/** C* for air at the same temperature, salinity and pressure (the 100 % of a DO probe). */
	airSaturationMgPerL: number;
	method: OxygenSolubilityMethod;
	validRange: ValidRange;
	temperatureC: number;
	salinityGPerKg: number;
	pressureKPa: number;
	o2MoleFraction: number;
	waterVapourPressureKPa: number;
	/** Factor from 1 atm to `pressureKPa` (APHA/USGS). */
	pressureFactor: number;
}

/** Water vapour pressure in atm over fresh water (APHA/USGS form). */
export function computeWaterVapourPressureAtm(temperatureC: number): number {
	const T = toKelvin(temperatureC);
	const [v0, v1, v2] = APHA_PRESSURE_CORRECTION.vapour;
	return Math.exp(v0 + v1 / T + v2 / (T * T));
}

export function computeBensonKrauseMgPerL(temperatureC: number, salinity: number): number {
	const T = toKelvin(temperatureC);
	const { a, b } = BENSON_KRAUSE_APHA;
	const lnC =
		a[0] +
		a[1] / T +
		a[2] / T ** 2 +
		a[3] / T ** 3 +
		a[4] / T ** 4 -
		salinity * (b[0] + b[1] / T + b[2] / T ** 2);
	return Math.exp(lnC);
}

export function computeGarciaGordonUmolPerKg(temperatureC: number, salinity: number): number {
	const ts = Math.log((298.15 - temperatureC) / toKelvin(temperatureC));
	const { a, b, c0 } = GARCIA_GORDON_COMBINED;
	let lnC = 0;
	for (let i = 0; i < a.length; i++) lnC += a[i] * ts ** i;
	for (let i = 0; i < b.length; i++) lnC += salinity * b[i] * ts ** i;
	return Math.exp(lnC + c0 * salinity * salinity);
}

/** Density in kg/L at 1 atm (Millero & Poisson 1981). */
export function computeWaterDensityKgPerL(temperatureC: number, salinityGPerKg = 0): number {
	const t = temperatureC;
	const { pureWater, a, b, c } = SEAWATER_DENSITY_MILLERO_POISSON;
	let rhoW = 0;
	for (let i = 0; i < pureWater.length; i++) rhoW += pureWater[i] * t ** i;
	let A = 0;
	for (let i = 0; i < a.length; i++) A += a[i] * t ** i;
	const B = b[0] + b[1] * t + b[2] * t * t;
	const S = salinityGPerKg;
	return (rhoW + A * S + B * S ** 1.5 + c * S * S) / 1000;
}

/**
 * C* in mg/L and mmol/L. Benson & Krause (1984) in the APHA 4500-O form by default, or Garcia &
 * Gordon (1992), both corrected to total pressure P by
 * C*_P = C*·P·(1 − Pwv/P)(1 − θP) / ((1 − Pwv)(1 − θ)) with P, Pwv in atm (APHA/USGS),
 * then scaled to the gas's O2 mole fraction.
 */
export function computeOxygenSaturation(
	input: OxygenSaturationInput,
	fieldPrefix = ''
): OxygenSaturationResult {
	const conditions = readSaturationConditions(input, fieldPrefix);
	const { method, range, temperatureC, salinityGPerKg, pressureKPa, o2MoleFraction } = conditions;
	const { pwvAtm, waterVapourPressureKPa } = conditions;

	const pAtm = pressureKPa / KPA_PER_ATM;
	const [th0, th1, th2] = APHA_PRESSURE_CORRECTION.theta;
	const theta = th0 + th1 * temperatureC + th2 * temperatureC ** 2;
	const pressureFactor =
		(pAtm * (1 - pwvAtm / pAtm) * (1 - theta * pAtm)) / ((1 - pwvAtm) * (1 - theta));

	let airAt1AtmMgPerL: number;
	let umolPerKgAt1Atm: number | undefined;
	if (method === 'benson-krause-1984') {
		airAt1AtmMgPerL = computeBensonKrauseMgPerL(temperatureC, salinityGPerKg);
	} else {
		umolPerKgAt1Atm = computeGarciaGordonUmolPerKg(temperatureC, salinityGPerKg);
		const densityKgPerL = computeWaterDensityKgPerL(temperatureC, salinityGPerKg);
		airAt1AtmMgPerL = (umolPerKgAt1Atm * densityKgPerL * O2_MOLAR_MASS_G_PER_MOL) / 1000;
	}
	const airSaturationMgPerL = airAt1AtmMgPerL * pressureFactor;
	const gasFactor = o2MoleFraction / AIR_O2_MOLE_FRACTION;
	const mgPerL = airSaturationMgPerL * gasFactor;
	const result: OxygenSaturationResult = {
		mgPerL,
		mmolPerL: mgPerL / O2_MOLAR_MASS_G_PER_MOL,
		airSaturationMgPerL,
		method,
		validRange: range,
		temperatureC,
		salinityGPerKg,
		pressureKPa,
		o2MoleFraction,
		waterVapourPressureKPa,
		pressureFactor
	};
	if (umolPerKgAt1Atm !== undefined)
		result.umolPerKg = umolPerKgAt1Atm * pressureFactor * gasFactor;
	return result;
}

/** The method, temperature, salinity, pressure and O2 content, each within the method's valid range. */
function readSaturationConditions(input: OxygenSaturationInput, fieldPrefix: string) {
	if (input === null || typeof input !== 'object') {
		throw new ChemistryInputError('Oxygen saturation needs an object with temperatureC', {
			field: fieldPrefix || undefined
		});
	}
	const method = input.method ?? 'benson-krause-1984';
	if (!(method in OXYGEN_SOLUBILITY_RANGES)) {
		throw new ChemistryInputError(
			`Unknown method '${String(method)}'; use 'benson-krause-1984' or 'garcia-gordon-1992'`,
			{ field: joinField(fieldPrefix, 'method') }
		);
	}
	const range = OXYGEN_SOLUBILITY_RANGES[method];
	const temperatureC = readFinite(
		input.temperatureC,
		joinField(fieldPrefix, 'temperatureC'),
		'Temperature'
	);
	const [tMin, tMax] = range.temperatureC;
	if (temperatureC < tMin || temperatureC > tMax) {
		throw new ChemistryInputError(
			`Temperature ${temperatureC} °C is outside the valid range of ${range.source}: ${tMin} to ${tMax} °C`,
			{ field: joinField(fieldPrefix, 'temperatureC') }
		);
	}
	const salinityGPerKg = readNonNegative(
		input.salinityGPerKg ?? 0,
		joinField(fieldPrefix, 'salinityGPerKg'),
		'Salinity'
	);
	const [sMin, sMax] = range.salinityGPerKg;
	if (salinityGPerKg < sMin || salinityGPerKg > sMax) {
		throw new ChemistryInputError(
			`Salinity ${salinityGPerKg} g/kg is outside the valid range of ${range.source}: ${sMin} to ${sMax} g/kg`,
			{ field: joinField(fieldPrefix, 'salinityGPerKg') }
		);
	}
	const pressureKPa = readPositive(
		input.pressureKPa ?? KPA_PER_ATM,
		joinField(fieldPrefix, 'pressureKPa'),
		'Pressure'
	);
	const pwvAtm = computeWaterVapourPressureAtm(temperatureC);
	const waterVapourPressureKPa = pwvAtm * KPA_PER_ATM;
	if (pressureKPa <= waterVapourPressureKPa || pressureKPa > MAX_PRESSURE_KPA) {
		throw new ChemistryInputError(
			`Pressure ${pressureKPa} kPa is outside the valid range at ${temperatureC} °C: above the water vapour pressure ${waterVapourPressureKPa.toFixed(2)} kPa up to ${MAX_PRESSURE_KPA} kPa`,
			{ field: joinField(fieldPrefix, 'pressureKPa') }
		);
	}
	const o2MoleFraction = readPositive(
		input.o2MoleFraction ?? AIR_O2_MOLE_FRACTION,
		joinField(fieldPrefix, 'o2MoleFraction'),
		'O2 mole fraction'
	);
	if (o2MoleFraction > 1) {
		throw new ChemistryInputError(`O2 mole fraction ${o2MoleFraction} must be at most 1`, {
			field: joinField(fieldPrefix, 'o2MoleFraction')
		});
	}
	return {
		method,
		range,
		temperatureC,
		salinityGPerKg,
		pressureKPa,
		o2MoleFraction,
		pwvAtm,
		waterVapourPressureKPa
	};
}
