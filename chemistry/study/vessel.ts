import { SECONDS_PER_HOUR } from '../units';
import { predictKla } from '../kla-correlation';
import { computeOperatingPoint } from '../kla/operating-point';
import { StudyDataError } from './errors';
import type { StudyVessel, VesselKlaMap } from './types';

export interface VesselKLa {
	kLaPerH: number;
	origin: string;
	/** said with the report's warnings: the plan lies outside what the map measured */
	warning: string | null;
}

const round3 = (x: number) => Number(x.toPrecision(3));

/**
 * kLa from the vessel's own measured map at its planned stirrer speed and gas flow, with the
 * liquid volume of the plan (P/V falls as the volume rises).
 */
/** Where a study runs the vessel; a value left null is the vessel's own planned one. */
export interface PlannedOperation {
	agitationRpm?: number | null;
	gasFlowLPerMin?: number | null;
}

function kLaFromMap(
	name: string,
	map: VesselKlaMap | null,
	liquidVolumeL: number,
	operation: PlannedOperation
): VesselKLa {
	if (!map)
		throw new StudyDataError(
			`The vessel “${name}” takes its kLa from its measured map, which needs at least 3 measured points.`,
			{ field: 'vessel.kLaMode' }
		);
	const { geometry } = map;
	const rpm = operation.agitationRpm ?? map.plannedAgitationRpm;
	const flow = operation.gasFlowLPerMin ?? map.plannedGasFlowLPerMin;
	const whose =
		operation.agitationRpm != null || operation.gasFlowLPerMin != null
			? "the study's"
			: "the vessel's planned";
	if (!geometry || rpm === null || flow === null)
		throw new StudyDataError(
			`The vessel “${name}” takes its kLa from its map but lacks a stirrer speed and gas flow (the study's or the vessel's planned ones), or its vessel or impeller diameter.`,
			{ field: 'vessel.plannedAgitationRpm' }
		);
	const point = computeOperatingPoint({
		...geometry,
		agitationRpm: rpm,
		gasFlowLPerMin: flow,
		liquidVolumeL
	});
	const predicted = predictKla(
		map.correlation,
		point.powerPerVolumeWPerM3,
		point.superficialVelocityMPerS
	);
	const { k, a, b, measuredRange } = map.correlation;
	const origin = `from the vessel's measured kLa map (${map.pointCount} points; kLa = ${k.toPrecision(3)}·(P/V)^${a.toFixed(2)}·v_s^${b.toFixed(2)}) at ${whose} ${rpm} rpm and ${flow} L/min with ${liquidVolumeL} L: P/V ${round3(point.powerPerVolumeWPerM3)} W/m³ (power number ${point.powerNumber}${point.powerNumberDefaulted ? ', common practice' : ''}), v_s ${round3(point.superficialVelocityMPerS * 1000)} mm/s`;
	const outside = [
		predicted.powerPerVolumeOutside
			? `P/V ${round3(point.powerPerVolumeWPerM3)} W/m³ (measured ${round3(measuredRange.powerPerVolumeWPerM3.low)}–${round3(measuredRange.powerPerVolumeWPerM3.high)})`
			: null,
		predicted.superficialVelocityOutside
			? `v_s ${round3(point.superficialVelocityMPerS * 1000)} mm/s (measured ${round3(measuredRange.superficialVelocityMPerS.low * 1000)}–${round3(measuredRange.superficialVelocityMPerS.high * 1000)})`
			: null
	].filter((x) => x !== null);
	return {
		kLaPerH: predicted.kLaPerH,
		origin,
		warning: outside.length
			? `The plan lies outside the vessel's measured kLa map: ${outside.join(' and ')}. The kLa of ${round3(predicted.kLaPerH)} 1/h is extrapolated; measure a point near the plan.`
			: null
	};
}

/**
 * The highest kLa a vessel or a what-if may state: 1/s, above what stirred tanks reach (microbial
 * stirred tanks 100–1000 1/h, from memory; chemistry/REFERENCES.md), so a larger value is a typing error.
 */
export const MAX_KLA_PER_H = 3600;

/**
 * The vessel's kLa in 1/h: from its measured map, as entered, or from kLa = k·(P/V)^a·(v_s)^b (van 't Riet 1979), whose
 * constants are the user's; as in van 't Riet's form, P/V is in W/m³, v_s in m/s and kLa in 1/s.
 */
export function computeVesselKLa(
	vessel: StudyVessel,
	liquidVolumeL: number,
	operation: PlannedOperation = {}
): VesselKLa {
	if (vessel.kLaMode === 'map')
		return kLaFromMap(vessel.name, vessel.klaMap, liquidVolumeL, operation);
	if (vessel.kLaMode === 'entered') {
		if (vessel.kLaPerH === null || !(vessel.kLaPerH > 0)) {
			throw new StudyDataError(
				`The vessel “${vessel.name}” has no kLa. Enter one, or the correlation constants.`,
				{ field: 'vessel.kLaPerH' }
			);
		}
		return { kLaPerH: vessel.kLaPerH, origin: 'entered for the vessel', warning: null };
	}
	const {
		correlationK: k,
		correlationA: a,
		correlationB: b,
		powerPerVolumeWPerM3: pv,
		superficialVelocityMPerS: vs
	} = vessel;
	if (k === null || a === null || b === null || pv === null || vs === null) {
		throw new StudyDataError(
			`The vessel “${vessel.name}” uses the kLa correlation but lacks k, a, b, P/V or the superficial gas velocity.`,
			{
				field: 'vessel.correlationK'
			}
		);
	}
	const kLaPerH = k * pv ** a * vs ** b * SECONDS_PER_HOUR;
	if (!Number.isFinite(kLaPerH) || kLaPerH <= 0) {
		throw new StudyDataError(
			`The kLa correlation of “${vessel.name}” gives ${kLaPerH} 1/h; check its constants.`,
			{ field: 'vessel.correlationK' }
		);
	}
	return {
		kLaPerH,
		origin: `from the correlation kLa = ${k}·(P/V)^${a}·(v_s)^${b} with P/V ${pv} W/m³, v_s ${vs} m/s (van 't Riet 1979 form; constants entered for the vessel)`,
		warning: null
	};
}
