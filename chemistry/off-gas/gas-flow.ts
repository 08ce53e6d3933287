/**
 * Gas flows as amounts of substance: a volumetric flow stated at reference conditions ("standard
 * litres") turned into mol/h through the ideal gas law.
 */
import { ChemistryInputError } from '../errors';
import { isGiven, readPositive } from '../input';
import { KPA_PER_ATM } from '../data/oxygen-solubility';
import { ZERO_CELSIUS_K } from '../units';

/** Molar gas constant R in J/(mol·K), exact since the 2019 SI redefinition (CODATA 2018). */
export const MOLAR_GAS_CONSTANT_J_PER_MOL_K = 8.314462618;

/** "Standard litres" are taken at 0 °C and 101.325 kPa unless the caller states otherwise. */
export const STANDARD_REFERENCE_TEMPERATURE_C = 0;
export const STANDARD_REFERENCE_PRESSURE_KPA = KPA_PER_ATM;

const MINUTES_PER_HOUR = 60;

/** Molar volume of an ideal gas in L/mol: R·T/P, with J/kPa = L. */
export function computeIdealMolarVolumeLPerMol(temperatureC: number, pressureKPa: number): number {
	const temperatureK = temperatureC + ZERO_CELSIUS_K;
	if (!(temperatureK > 0)) {
		throw new ChemistryInputError(
			`Reference temperature must be above absolute zero (−273.15 °C), not ${temperatureC} °C`,
			{ field: 'referenceTemperatureC' }
		);
	}
	return (MOLAR_GAS_CONSTANT_J_PER_MOL_K * temperatureK) / pressureKPa;
}

export interface InletGasFlowInput {
	/** volumetric flow at the reference conditions below */
	inletGasFlowLPerMin?: number | null;
	/** default 0 °C */
	referenceTemperatureC?: number | null;
	/** default 101.325 kPa */
	referencePressureKPa?: number | null;
	/** molar flow, instead of the volumetric one */
	inletGasFlowMolPerH?: number | null;
}

export interface InletGasFlow {
	molPerH: number;
	/** the molar volume used, or null when the flow was given in mol/h */
	molarVolumeLPerMol: number | null;
}

/** The inlet flow in mol/h from exactly one of L/min (at reference conditions) or mol/h. */
export function readInletGasFlow(input: InletGasFlowInput): InletGasFlow {
	const byVolume = isGiven(input.inletGasFlowLPerMin);
	const byAmount = isGiven(input.inletGasFlowMolPerH);
	if (byVolume === byAmount) {
		throw new ChemistryInputError(
			byVolume
				? 'Give the inlet gas flow either in L/min or in mol/h, not both.'
				: 'Inlet gas flow is missing: give it in L/min (at stated conditions) or in mol/h.',
			{ field: 'inletGasFlowLPerMin' }
		);
	}
	if (byAmount) {
		const molPerH = readPositive(
			input.inletGasFlowMolPerH,
			'inletGasFlowMolPerH',
			'Inlet gas flow'
		);
		return { molPerH, molarVolumeLPerMol: null };
	}
	const litresPerMin = readPositive(
		input.inletGasFlowLPerMin,
		'inletGasFlowLPerMin',
		'Inlet gas flow'
	);
	const temperatureC = isGiven(input.referenceTemperatureC)
		? readFiniteTemperature(input.referenceTemperatureC)
		: STANDARD_REFERENCE_TEMPERATURE_C;
	const pressureKPa = isGiven(input.referencePressureKPa)
		? readPositive(input.referencePressureKPa, 'referencePressureKPa', 'Reference pressure')
		: STANDARD_REFERENCE_PRESSURE_KPA;
	const molarVolumeLPerMol = computeIdealMolarVolumeLPerMol(temperatureC, pressureKPa);
	return { molPerH: (litresPerMin * MINUTES_PER_HOUR) / molarVolumeLPerMol, molarVolumeLPerMol };
}

function readFiniteTemperature(value: unknown): number {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new ChemistryInputError('Reference temperature must be a finite number of °C', {
			field: 'referenceTemperatureC'
		});
	}
	return value;
}
