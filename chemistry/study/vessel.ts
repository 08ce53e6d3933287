import { SECONDS_PER_HOUR } from '../units';
import { StudyDataError } from './errors';
import type { StudyVessel } from './types';

/**
 * The highest kLa a vessel or a what-if may state: 1/s, above what stirred tanks reach (microbial
 * stirred tanks 100–1000 1/h, from memory; chemistry/REFERENCES.md), so a larger value is a typing error.
 */
export const MAX_KLA_PER_H = 3600;

/**
 * The vessel's kLa in 1/h: as entered, or from kLa = k·(P/V)^a·(v_s)^b (van 't Riet 1979), whose
 * constants are the user's; as in van 't Riet's form, P/V is in W/m³, v_s in m/s and kLa in 1/s.
 */
export function computeVesselKLa(vessel: StudyVessel): { kLaPerH: number; origin: string } {
	if (vessel.kLaMode === 'entered') {
		if (vessel.kLaPerH === null || !(vessel.kLaPerH > 0)) {
			throw new StudyDataError(
				`The vessel “${vessel.name}” has no kLa. Enter one, or the correlation constants.`,
				{ field: 'vessel.kLaPerH' }
			);
		}
		return { kLaPerH: vessel.kLaPerH, origin: 'entered for the vessel' };
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
		origin: `from the correlation kLa = ${k}·(P/V)^${a}·(v_s)^${b} with P/V ${pv} W/m³, v_s ${vs} m/s (van 't Riet 1979 form; constants entered for the vessel)`
	};
}
