/**
 * Oxygen transfer and uptake: OTR against OUR, the DO setpoint, the O2 demand of growth. Saturation
 * (C* of water against air or enriched gas) is in ./oxygen-saturation.ts.
 */
import { ChemistryInputError } from './errors';
import { SECONDS_PER_HOUR } from './units';
import { joinField, readNonNegative, readPositive } from './input';
import { AIR_O2_MOLE_FRACTION } from './data/oxygen-solubility';
import {
	O2_MOLAR_MASS_G_PER_MOL,
	type OxygenSaturationInput,
	type OxygenSaturationResult,
	computeOxygenSaturation
} from './oxygen-saturation';
export {
	O2_MOLAR_MASS_G_PER_MOL,
	type OxygenSolubilityMethod,
	type ValidRange,
	OXYGEN_SOLUBILITY_RANGES,
	MAX_PRESSURE_KPA,
	type OxygenSaturationInput,
	type OxygenSaturationResult,
	computeWaterDensityKgPerL,
	computeOxygenSaturation
} from './oxygen-saturation';

export { AIR_O2_MOLE_FRACTION, AIR_O2_MOLE_FRACTION_SOURCE } from './data/oxygen-solubility';

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
		joinField(fieldPrefix, 'specificGrowthRatePerH'),
		'Specific growth rate'
	);
	const x = readNonNegative(input.biomassGPerL, joinField(fieldPrefix, 'biomassGPerL'), 'Biomass');
	const y = readPositive(
		input.yieldBiomassOnOxygenGPerG,
		joinField(fieldPrefix, 'yieldBiomassOnOxygenGPerG'),
		'Yx/O2'
	);
	const m = readNonNegative(
		input.maintenanceGO2PerGH ?? 0,
		joinField(fieldPrefix, 'maintenanceGO2PerGH'),
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
	return (convertOxygenMgPerLToMmolPerL(setpointMgPerL) / our) * SECONDS_PER_HOUR;
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
				? (setpointMgPerL / O2_MOLAR_MASS_G_PER_MOL / peakOur.mmolPerLH) * SECONDS_PER_HOUR
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
	const x = readNonNegative(input.biomassProducedGPerL, 'biomassProducedGPerL', 'Biomass produced');
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
