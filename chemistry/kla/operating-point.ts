/**
 * Where a vessel is run, as the kLa correlation reads it: P/V from the impeller power relation and v_s
 * from the gas flow over the vessel's cross-section (both in chemistry/kla-correlation.ts).
 */
import { readPositive } from '../input';
import {
	RUSHTON_POWER_NUMBER,
	superficialGasVelocityMPerS,
	ungassedPowerW
} from '../kla-correlation';

/** Density of the broth taken as water's, kg/m³ (common practice for dilute media). */
export const BROTH_DENSITY_KG_PER_M3 = 1000;

export interface VesselGeometry {
	vesselDiameterM: number;
	impellerDiameterM: number;
	/** impellers on the shaft, each drawing the same power (no interaction: common practice for spaced impellers) */
	impellerCount: number;
	/** null: RUSHTON_POWER_NUMBER, common practice */
	powerNumber: number | null;
}

export interface OperatingPointInput extends VesselGeometry {
	agitationRpm: number;
	gasFlowLPerMin: number;
	liquidVolumeL: number;
}

export interface OperatingPoint {
	powerPerVolumeWPerM3: number;
	superficialVelocityMPerS: number;
	powerNumber: number;
	/** true when the power number is the common-practice default, not the vessel's own */
	powerNumberDefaulted: boolean;
}

/** P/V (ungassed, W/m³) and v_s (m/s) at a stirrer speed, gas flow and liquid volume. */
export function computeOperatingPoint(input: OperatingPointInput): OperatingPoint {
	const rpm = readPositive(input.agitationRpm, 'agitationRpm', 'Stirrer speed');
	const volumeL = readPositive(input.liquidVolumeL, 'liquidVolumeL', 'Liquid volume');
	const count = readPositive(input.impellerCount, 'impellerCount', 'Number of impellers');
	const powerNumber = input.powerNumber ?? RUSHTON_POWER_NUMBER;
	const powerW =
		count *
		ungassedPowerW({
			powerNumber,
			speedPerS: rpm / 60,
			impellerDiameterM: input.impellerDiameterM,
			densityKgPerM3: BROTH_DENSITY_KG_PER_M3
		});
	return {
		powerPerVolumeWPerM3: powerW / (volumeL / 1000),
		superficialVelocityMPerS: superficialGasVelocityMPerS({
			gasFlowLPerMin: input.gasFlowLPerMin,
			vesselDiameterM: input.vesselDiameterM
		}),
		powerNumber,
		powerNumberDefaulted: input.powerNumber === null
	};
}
