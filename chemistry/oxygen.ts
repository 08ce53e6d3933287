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
import { readFinite, readNonNegative, readPositive } from './input';
import { molarMassOf } from './formula';
import {
	AIR_O2_MOLE_FRACTION,
	APHA_PRESSURE_CORRECTION,
	BENSON_KRAUSE_APHA,
	GARCIA_GORDON_COMBINED,
	KPA_PER_ATM,
	SEAWATER_DENSITY_MILLERO_POISSON
} from './data/oxygen-solubility';

export { AIR_O2_MOLE_FRACTION, AIR_O2_MOLE_FRACTION_SOURCE } from './data/oxygen-solubility';

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

function join(prefix: string, field: string): string {
	return prefix ? `${prefix}.${field}` : field;
}

/** Water vapour pressure in atm over fresh water (APHA/USGS form). */
function computeWaterVapourPressureAtm(temperatureC: number): number {
	const T = temperatureC + 273.15;
	const [v0, v1, v2] = APHA_PRESSURE_CORRECTION.vapour;
	return Math.exp(v0 + v1 / T + v2 / (T * T));
}

function computeBensonKrauseMgPerL(temperatureC: number, salinity: number): number {
	const T = temperatureC + 273.15;
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

function computeGarciaGordonUmolPerKg(temperatureC: number, salinity: number): number {
	const ts = Math.log((298.15 - temperatureC) / (273.15 + temperatureC));
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
	if (input === null || typeof input !== 'object') {
		throw new ChemistryInputError('Oxygen saturation needs an object with temperatureC', {
			field: fieldPrefix || undefined
		});
	}
	const method = input.method ?? 'benson-krause-1984';
	if (!(method in OXYGEN_SOLUBILITY_RANGES)) {
		throw new ChemistryInputError(
			`Unknown method '${String(method)}'; use 'benson-krause-1984' or 'garcia-gordon-1992'`,
			{ field: join(fieldPrefix, 'method') }
		);
	}
	const range = OXYGEN_SOLUBILITY_RANGES[method];
	const temperatureC = readFinite(
		input.temperatureC,
		join(fieldPrefix, 'temperatureC'),
		'Temperature'
	);
	const [tMin, tMax] = range.temperatureC;
	if (temperatureC < tMin || temperatureC > tMax) {
		throw new ChemistryInputError(
			`Temperature ${temperatureC} °C is outside the valid range of ${range.source}: ${tMin} to ${tMax} °C`,
			{ field: join(fieldPrefix, 'temperatureC') }
		);
	}
	const salinityGPerKg = readNonNegative(
		input.salinityGPerKg ?? 0,
		join(fieldPrefix, 'salinityGPerKg'),
		'Salinity'
	);
	const [sMin, sMax] = range.salinityGPerKg;
	if (salinityGPerKg < sMin || salinityGPerKg > sMax) {
		throw new ChemistryInputError(
			`Salinity ${salinityGPerKg} g/kg is outside the valid range of ${range.source}: ${sMin} to ${sMax} g/kg`,
			{ field: join(fieldPrefix, 'salinityGPerKg') }
		);
	}
	const pressureKPa = readPositive(
		input.pressureKPa ?? KPA_PER_ATM,
		join(fieldPrefix, 'pressureKPa'),
		'Pressure'
	);
	const pwvAtm = computeWaterVapourPressureAtm(temperatureC);
	const waterVapourPressureKPa = pwvAtm * KPA_PER_ATM;
	if (pressureKPa <= waterVapourPressureKPa || pressureKPa > MAX_PRESSURE_KPA) {
		throw new ChemistryInputError(
			`Pressure ${pressureKPa} kPa is outside the valid range at ${temperatureC} °C: above the water vapour pressure ${waterVapourPressureKPa.toFixed(2)} kPa up to ${MAX_PRESSURE_KPA} kPa`,
			{ field: join(fieldPrefix, 'pressureKPa') }
		);
	}
	const o2MoleFraction = readPositive(
		input.o2MoleFraction ?? AIR_O2_MOLE_FRACTION,
		join(fieldPrefix, 'o2MoleFraction'),
		'O2 mole fraction'
	);
	if (o2MoleFraction > 1) {
		throw new ChemistryInputError(`O2 mole fraction ${o2MoleFraction} must be at most 1`, {
			field: join(fieldPrefix, 'o2MoleFraction')
		});
	}

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

export function convertOxygenMgPerLToMmolPerL(mgPerL: number): number {
	return mgPerL / O2_MOLAR_MASS_G_PER_MOL;
}

export function convertOxygenMmolPerLToMgPerL(mmolPerL: number): number {
	return mmolPerL * O2_MOLAR_MASS_G_PER_MOL;
}

export interface OxygenRate {
	mgPerLH: number;
	mmolPerLH: number;
}

function rateFromMgPerLH(mgPerLH: number): OxygenRate {
	return { mgPerLH, mmolPerLH: mgPerLH / O2_MOLAR_MASS_G_PER_MOL };
}

/** Maximum oxygen transfer rate kLa·(C* − C_setpoint): the transfer at the lowest allowed DO. */
export function computeMaxOtr(input: {
	kLaPerH: number;
	saturationMgPerL: number;
	setpointMgPerL: number;
}): OxygenRate {
	const kLaPerH = readPositive(input.kLaPerH, 'kLaPerH', 'kLa');
	const saturationMgPerL = readPositive(
		input.saturationMgPerL,
		'saturationMgPerL',
		'Saturation C*'
	);
	const setpointMgPerL = readNonNegative(input.setpointMgPerL, 'setpointMgPerL', 'DO setpoint');
	if (setpointMgPerL >= saturationMgPerL) {
		throw new ChemistryInputError(
			`DO setpoint ${setpointMgPerL.toFixed(3)} mg/L is at or above the saturation ${saturationMgPerL.toFixed(3)} mg/L, so no oxygen can be transferred`,
			{ field: 'setpointMgPerL' }
		);
	}
	return rateFromMgPerLH(kLaPerH * (saturationMgPerL - setpointMgPerL));
}

export interface GrowthUptakeInput {
	specificGrowthRatePerH: number;
	biomassGPerL: number;
	/** Yx/O2, g dry biomass per g O2. */
	yieldBiomassOnOxygenGPerG: number;
	/** m_O, g O2 per g dry biomass per hour; default 0. */
	maintenanceGO2PerGH?: number;
}

/** OUR = (μ / Yx/O2 + m_O) · X, Pirt's maintenance model (Pirt 1965, Proc. R. Soc. B; citation from memory). */
export function computeOxygenUptakeRate(input: GrowthUptakeInput, fieldPrefix = ''): OxygenRate {
	const mu = readNonNegative(
		input.specificGrowthRatePerH,
		join(fieldPrefix, 'specificGrowthRatePerH'),
		'Specific growth rate'
	);
	const x = readNonNegative(input.biomassGPerL, join(fieldPrefix, 'biomassGPerL'), 'Biomass');
	const y = readPositive(
		input.yieldBiomassOnOxygenGPerG,
		join(fieldPrefix, 'yieldBiomassOnOxygenGPerG'),
		'Yx/O2'
	);
	const m = readNonNegative(
		input.maintenanceGO2PerGH ?? 0,
		join(fieldPrefix, 'maintenanceGO2PerGH'),
		'Maintenance'
	);
	return rateFromMgPerLH((mu / y + m) * x * 1000);
}

/** Seconds the dissolved oxygen at the setpoint lasts if transfer stops: C_set / OUR. */
export function computeOxygenReserveS(input: {
	setpointMgPerL: number;
	ourMmolPerLH: number;
}): number {
	const setpointMgPerL = readNonNegative(input.setpointMgPerL, 'setpointMgPerL', 'DO setpoint');
	const our = readPositive(input.ourMmolPerLH, 'ourMmolPerLH', 'OUR');
	return (convertOxygenMgPerLToMmolPerL(setpointMgPerL) / our) * 3600;
}

export type DoSetpoint = { percentAirSaturation: number } | { mgPerL: number };

export interface OxygenTransferInput {
	/** Temperature, salinity, pressure and the O2 mole fraction of the gas actually sparged. */
	conditions: OxygenSaturationInput;
	kLaPerH: number;
	/** Percent of air saturation at the same temperature, salinity and pressure, or mg/L. */
	setpoint: DoSetpoint;
	/** The peak uptake: either measured/estimated OUR, or μ, X, Yx/O2 (and m_O) at the peak. */
	uptake: { ourMmolPerLH: number } | GrowthUptakeInput;
}

export interface OxygenTransferResult {
	saturation: OxygenSaturationResult;
	setpointMgPerL: number;
	drivingForceMgPerL: number;
	maxOtr: OxygenRate;
	peakOur: OxygenRate;
	verdict: 'sufficient' | 'insufficient';
	/** peak OUR / max OTR; above 1 the DO falls below the setpoint. */
	utilisation: number;
	/** kLa that would just meet the peak OUR at this gas: OUR / (C* − C_set). */
	kLaNeededPerH: number;
	/** O2 mole fraction of the gas that would just meet the peak OUR at this kLa. */
	o2MoleFractionNeeded: number;
	/** False when even pure O2 (mole fraction 1) at this kLa and pressure would fall short. */
	enrichmentFeasible: boolean;
	/** Seconds of oxygen held at the setpoint at the peak OUR; null when the OUR is 0. */
	reserveS: number | null;
}

function resolveSetpointMgPerL(setpoint: DoSetpoint, airSaturationMgPerL: number): number {
	if (setpoint === null || typeof setpoint !== 'object') {
		throw new ChemistryInputError('Setpoint must be { percentAirSaturation } or { mgPerL }', {
			field: 'setpoint'
		});
	}
	if ('percentAirSaturation' in setpoint) {
		const pct = readNonNegative(
			setpoint.percentAirSaturation,
			'setpoint.percentAirSaturation',
			'DO setpoint'
		);
		return (pct / 100) * airSaturationMgPerL;
	}
	if ('mgPerL' in setpoint)
		return readNonNegative(setpoint.mgPerL, 'setpoint.mgPerL', 'DO setpoint');
	throw new ChemistryInputError('Setpoint must be { percentAirSaturation } or { mgPerL }', {
		field: 'setpoint'
	});
}

/**
 * Can the vessel supply the peak oxygen demand? Compares peak OUR with kLa·(C* − C_set) and, since
 * C* is linear in the O2 mole fraction x, solves C*(x) − C_set = OUR/kLa for x.
 */
export function assessOxygenTransfer(input: OxygenTransferInput): OxygenTransferResult {
	if (input === null || typeof input !== 'object') {
		throw new ChemistryInputError('Oxygen transfer input must be an object');
	}
	const saturation = computeOxygenSaturation(input.conditions, 'conditions');
	const kLaPerH = readPositive(input.kLaPerH, 'kLaPerH', 'kLa');
	const setpointMgPerL = resolveSetpointMgPerL(input.setpoint, saturation.airSaturationMgPerL);
	const drivingForceMgPerL = saturation.mgPerL - setpointMgPerL;
	if (drivingForceMgPerL <= 0) {
		throw new ChemistryInputError(
			`DO setpoint ${setpointMgPerL.toFixed(3)} mg/L is at or above the saturation ${saturation.mgPerL.toFixed(3)} mg/L for this gas, so no oxygen can be transferred`,
			{ field: 'setpoint' }
		);
	}
	const uptake = input.uptake;
	if (uptake === null || typeof uptake !== 'object') {
		throw new ChemistryInputError('Uptake must be { ourMmolPerLH } or growth parameters', {
			field: 'uptake'
		});
	}
	const peakOur =
		'ourMmolPerLH' in uptake
			? (() => {
					const mmol = readNonNegative(uptake.ourMmolPerLH, 'uptake.ourMmolPerLH', 'OUR');
					return { mmolPerLH: mmol, mgPerLH: convertOxygenMmolPerLToMgPerL(mmol) };
				})()
			: computeOxygenUptakeRate(uptake, 'uptake');
	const maxOtr = rateFromMgPerLH(kLaPerH * drivingForceMgPerL);
	const utilisation = peakOur.mgPerLH / maxOtr.mgPerLH;
	const airPerUnitFraction = saturation.airSaturationMgPerL / AIR_O2_MOLE_FRACTION;
	const o2MoleFractionNeeded = (setpointMgPerL + peakOur.mgPerLH / kLaPerH) / airPerUnitFraction;
	return {
		saturation,
		setpointMgPerL,
		drivingForceMgPerL,
		maxOtr,
		peakOur,
		verdict: peakOur.mgPerLH <= maxOtr.mgPerLH ? 'sufficient' : 'insufficient',
		utilisation,
		kLaNeededPerH: peakOur.mgPerLH / drivingForceMgPerL,
		o2MoleFractionNeeded,
		enrichmentFeasible: o2MoleFractionNeeded <= 1,
		reserveS:
			peakOur.mmolPerLH > 0
				? (setpointMgPerL / O2_MOLAR_MASS_G_PER_MOL / peakOur.mmolPerLH) * 3600
				: null
	};
}

export interface OxygenDemandInput {
	/** g O2 per g dry biomass (e.g. `yields.oxygenPerBiomassGPerG` of a solved stoichiometry)… */
	oxygenPerBiomassGPerG?: number;
	/** …or its inverse, Yx/O2 in g biomass per g O2. */
	yieldBiomassOnOxygenGPerG?: number;
	/** Dry biomass formed over the run, g/L. */
	biomassProducedGPerL: number;
	workingVolumeL: number;
}

export interface OxygenDemandResult {
	oxygenPerBiomassGPerG: number;
	perLitreG: number;
	perLitreMol: number;
	totalG: number;
	totalMol: number;
}

/** Total O2 a run consumes for growth: (g O2 / g biomass) × biomass formed × volume. */
export function computeOxygenDemand(input: OxygenDemandInput): OxygenDemandResult {
	let perBiomass: number;
	if (input.oxygenPerBiomassGPerG !== undefined) {
		if (input.yieldBiomassOnOxygenGPerG !== undefined) {
			throw new ChemistryInputError(
				'Give either oxygenPerBiomassGPerG or yieldBiomassOnOxygenGPerG, not both',
				{
					field: 'yieldBiomassOnOxygenGPerG'
				}
			);
		}
		perBiomass = readPositive(
			input.oxygenPerBiomassGPerG,
			'oxygenPerBiomassGPerG',
			'O2 per biomass'
		);
	} else if (input.yieldBiomassOnOxygenGPerG !== undefined) {
		perBiomass =
			1 / readPositive(input.yieldBiomassOnOxygenGPerG, 'yieldBiomassOnOxygenGPerG', 'Yx/O2');
	} else {
		throw new ChemistryInputError(
			'Oxygen demand needs oxygenPerBiomassGPerG or yieldBiomassOnOxygenGPerG',
			{
				field: 'oxygenPerBiomassGPerG'
			}
		);
	}
	const x = readNonNegative(
		input.biomassProducedGPerL,
		'biomassProducedGPerL',
		'Biomass produced'
	);
	const v = readPositive(input.workingVolumeL, 'workingVolumeL', 'Working volume');
	const perLitreG = perBiomass * x;
	return {
		oxygenPerBiomassGPerG: perBiomass,
		perLitreG,
		perLitreMol: perLitreG / O2_MOLAR_MASS_G_PER_MOL,
		totalG: perLitreG * v,
		totalMol: (perLitreG * v) / O2_MOLAR_MASS_G_PER_MOL
	};
}
