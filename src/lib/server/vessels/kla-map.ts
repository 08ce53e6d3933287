import { asc, eq } from 'drizzle-orm';
import {
	ChemistryInputError,
	fitKlaCorrelation,
	type KlaCorrelationFit,
	type StudyVessel,
	type VesselGeometry,
	type VesselKlaMap
} from '$chemistry';
import { db, type Db } from '../db';
import { user, vesselKlaPoint, type VesselKlaPointRow, type VesselRow } from '../db/schema';

type Reader = Pick<Db, 'select'>;

/** The vessel's measured points, oldest first, with who measured each. */
export function listKlaPoints(vesselId: string, reader: Reader = db) {
	return reader
		.select({ point: vesselKlaPoint, byName: user.name })
		.from(vesselKlaPoint)
		.innerJoin(user, eq(user.id, vesselKlaPoint.createdById))
		.where(eq(vesselKlaPoint.vesselId, vesselId))
		.orderBy(asc(vesselKlaPoint.measuredOn), asc(vesselKlaPoint.createdAt))
		.all()
		.map(({ point, byName }) => ({ ...point, byName }));
}

export type KlaMapFit = { fit: KlaCorrelationFit; problem: null } | { fit: null; problem: string };

/** The correlation through the points, or why there is none (too few points, all at one P/V …). */
export function fitKlaMap(
	points: Pick<VesselKlaPointRow, 'powerPerVolumeWPerM3' | 'superficialVelocityMPerS' | 'kLaPerH'>[]
): KlaMapFit {
	try {
		return {
			fit: fitKlaCorrelation(
				points.map((p) => ({
					powerPerVolumeWPerM3: p.powerPerVolumeWPerM3,
					superficialVelocityMPerS: p.superficialVelocityMPerS,
					kLaPerS: p.kLaPerH / 3600
				}))
			),
			problem: null
		};
	} catch (cause) {
		if (cause instanceof ChemistryInputError) return { fit: null, problem: cause.message };
		throw cause;
	}
}

/** The geometry the map needs to turn speed and flow into P/V and v_s, or null while any is missing. */
export function vesselGeometry(row: VesselRow): VesselGeometry | null {
	if (row.vesselDiameterM === null || row.impellerDiameterM === null) return null;
	return {
		vesselDiameterM: row.vesselDiameterM,
		impellerDiameterM: row.impellerDiameterM,
		impellerCount: row.impellerCount,
		powerNumber: row.powerNumber
	};
}

/** The vessel as a study reads it: its row with its fitted kLa map. */
export function toStudyVessel<R extends VesselRow>(row: R, reader: Reader = db): R & StudyVessel {
	const { fit } = fitKlaMap(listKlaPoints(row.id, reader));
	const klaMap: VesselKlaMap | null = fit
		? {
				correlation: fit,
				pointCount: fit.points.length,
				geometry: vesselGeometry(row),
				plannedAgitationRpm: row.plannedAgitationRpm,
				plannedGasFlowLPerMin: row.plannedGasFlowLPerMin
			}
		: null;
	return { ...row, klaMap };
}
