// A kLa measurement of a vessel: the DO readings read and fitted (gassing-out or the dynamic
// method during a run), the operating point it was taken at, and the point saved to the vessel's map.
import { and, eq } from 'drizzle-orm';
import { z } from 'zod';
import {
	ChemistryInputError,
	analyseDynamicMethod,
	computeOperatingPoint,
	fitGassingOut,
	type DissolvedOxygenUnit,
	type GassingOutFit
} from '$chemistry';
import { KLA_METHODS, type KlaPowerSource } from '$lib/kla';
import { recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { vessel, vesselKlaPoint, type VesselRow } from '../db/schema';
import { RuleError } from '../rule-error';
import { optionalNumber, optionalText, requiredNumber } from '../studies/fields';
import { readRunCsv } from '../runs/read-points';
import { vesselGeometry } from './kla-map';

export const klaMeasureSchema = z.object({
	method: z.enum(KLA_METHODS, { error: 'Choose how the kLa was measured' }),
	readings: z.string().max(2_000_000, 'The readings are longer than 2 MB').default(''),
	probeTimeConstantS: optionalNumber('Probe time constant', { min: 0, max: 600, unit: 's' }),
	startS: optionalNumber('Re-aeration starts at', { min: 0, unit: 's' }),
	gasOnS: optionalNumber('Air back on at', { gt: 0, unit: 's' }),
	enteredKLaPerH: optionalNumber('kLa', { gt: 0, max: 3600, unit: '1/h' }),
	measuredOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Measured on must be a date, YYYY-MM-DD'),
	agitationRpm: requiredNumber('Stirrer speed', { gt: 0, max: 5000, unit: 'rpm' }),
	gasFlowLPerMin: requiredNumber('Gas flow', { gt: 0, max: 100000, unit: 'L/min' }),
	liquidVolumeL: requiredNumber('Liquid volume', { gt: 0, max: 100000, unit: 'L' }),
	temperatureC: requiredNumber('Temperature', { min: 0, max: 100, unit: '°C' }),
	powerPerVolumeWPerM3: optionalNumber('P/V measured', { gt: 0, max: 100000, unit: 'W/m³' }),
	notes: optionalText()
});

export type KlaMeasureForm = z.infer<typeof klaMeasureSchema>;

export interface KlaMeasurement {
	kLaPerH: number;
	kLaLowPerH: number | null;
	kLaHighPerH: number | null;
	readings: { timeS: number[]; dissolvedOxygen: number[]; unit: DissolvedOxygenUnit } | null;
	fit: GassingOutFit | null;
	/** the dynamic method's OUR, in the DO unit per hour */
	ourPerH: number | null;
	warnings: string[];
	powerPerVolumeWPerM3: number;
	powerSource: KlaPowerSource;
	superficialVelocityMPerS: number;
	powerNote: string;
}

/** The readings CSV: a time column (time_s, time_min, time_h) and one DO column (do_percent or do_mg_per_l). */
function readReadings(text: string) {
	if (!text.trim())
		throw new RuleError('Paste the DO readings or choose their CSV file.', { field: 'readings' });
	const read = readRunCsv(text, 0);
	if (!read.ok)
		throw new RuleError(read.problems.map((p) => p.message).join(' '), { field: 'readings' });
	const signals = [...read.batch.series.keys()];
	const dissolved = signals.filter((s) => s === 'do_percent' || s === 'do_mg_per_l');
	const others = signals.filter((s) => s !== 'do_percent' && s !== 'do_mg_per_l');
	if (dissolved.length !== 1 || others.length)
		throw new RuleError(
			`The readings need a time column and exactly one DO column (do_percent or do_mg_per_l)${others.length ? `; ${others.join(', ')} is not read here` : ''}.`,
			{ field: 'readings' }
		);
	const series = read.batch.series.get(dissolved[0])!;
	return {
		timeS: series.timeS,
		dissolvedOxygen: series.value,
		unit: (dissolved[0] === 'do_percent' ? 'percentSaturation' : 'mgPerL') as DissolvedOxygenUnit
	};
}

function operatingPoint(row: VesselRow, form: KlaMeasureForm) {
	const geometry = vesselGeometry(row);
	if (!geometry)
		throw new RuleError(
			'Enter the vessel inner diameter and impeller diameter on the vessel first: they turn the gas flow into the superficial gas velocity and the stirrer speed into P/V.'
		);
	const point = computeOperatingPoint({
		...geometry,
		agitationRpm: form.agitationRpm,
		gasFlowLPerMin: form.gasFlowLPerMin,
		liquidVolumeL: form.liquidVolumeL
	});
	const measured = form.powerPerVolumeWPerM3;
	return {
		powerPerVolumeWPerM3: measured ?? point.powerPerVolumeWPerM3,
		powerSource: (measured === null ? 'powerNumber' : 'measured') as KlaPowerSource,
		superficialVelocityMPerS: point.superficialVelocityMPerS,
		powerNote:
			measured === null
				? `P/V from n·Np·ρ·N³·D⁵/V with Np ${point.powerNumber}${point.powerNumberDefaulted ? ' (common practice for a Rushton turbine)' : ''}, ${geometry.impellerCount} impeller(s) of ${geometry.impellerDiameterM} m, ρ 1000 kg/m³; ungassed, so above the gassed power`
				: 'P/V as measured'
	};
}

/** Reads and fits the readings; throws RuleError at the field that is wrong. */
export function measureKla(row: VesselRow, form: KlaMeasureForm): KlaMeasurement {
	const where = operatingPoint(row, form);
	if (form.method === 'entered') {
		if (form.enteredKLaPerH === null)
			throw new RuleError('Enter the kLa measured.', { field: 'enteredKLaPerH' });
		return {
			kLaPerH: form.enteredKLaPerH,
			kLaLowPerH: null,
			kLaHighPerH: null,
			readings: null,
			fit: null,
			ourPerH: null,
			warnings: [],
			...where
		};
	}
	const readings = readReadings(form.readings);
	try {
		if (form.method === 'gassingOut') {
			const fit = fitGassingOut({
				timeS: readings.timeS,
				dissolvedOxygen: readings.dissolvedOxygen,
				dissolvedOxygenUnit: readings.unit,
				probeTimeConstantS: form.probeTimeConstantS,
				startS: form.startS ?? undefined
			});
			return {
				kLaPerH: fit.kLaPerH.value,
				kLaLowPerH: fit.kLaPerH.lower95,
				kLaHighPerH: fit.kLaPerH.upper95,
				readings,
				fit,
				ourPerH: null,
				warnings: fit.warnings,
				...where
			};
		}
		if (form.gasOnS === null)
			throw new RuleError('Say when the air came back on, in seconds from the first reading.', {
				field: 'gasOnS'
			});
		const gasOnS = form.gasOnS;
		const split = (keep: (t: number) => boolean) => {
			const idx = readings.timeS.map((_, i) => i).filter((i) => keep(readings.timeS[i]));
			return {
				timeS: idx.map((i) => readings.timeS[i]),
				dissolvedOxygen: idx.map((i) => readings.dissolvedOxygen[i])
			};
		};
		const result = analyseDynamicMethod({
			gasOff: split((t) => t < gasOnS),
			gasOn: split((t) => t >= gasOnS),
			dissolvedOxygenUnit: readings.unit,
			probeTimeConstantS: form.probeTimeConstantS
		});
		return {
			kLaPerH: result.kLaPerH.value,
			kLaLowPerH: result.kLaPerH.lower95,
			kLaHighPerH: result.kLaPerH.upper95,
			readings,
			fit: result.recovery,
			ourPerH: result.ourPerH.value,
			warnings: result.warnings,
			...where
		};
	} catch (cause) {
		if (cause instanceof ChemistryInputError)
			throw new RuleError(cause.message, { field: 'readings' });
		throw cause;
	}
}

/** Fits again from the form (never from what the page showed) and adds the point to the map. */
export function saveKlaPoint(
	actor: Actor & { id: string },
	vesselId: string,
	form: KlaMeasureForm
) {
	const row = db.select().from(vessel).where(eq(vessel.id, vesselId)).get();
	if (!row) throw new RuleError('No such vessel.', { status: 404 });
	const measured = measureKla(row, form);
	const id = crypto.randomUUID();
	db.transaction((tx) => {
		tx.insert(vesselKlaPoint)
			.values({
				id,
				vesselId,
				measuredOn: form.measuredOn,
				method: form.method,
				agitationRpm: form.agitationRpm,
				gasFlowLPerMin: form.gasFlowLPerMin,
				liquidVolumeL: form.liquidVolumeL,
				powerPerVolumeWPerM3: measured.powerPerVolumeWPerM3,
				powerSource: measured.powerSource,
				superficialVelocityMPerS: measured.superficialVelocityMPerS,
				temperatureC: form.temperatureC,
				kLaPerH: measured.kLaPerH,
				kLaLowPerH: measured.kLaLowPerH,
				kLaHighPerH: measured.kLaHighPerH,
				probeTimeConstantS: form.probeTimeConstantS,
				readings: measured.readings,
				notes: form.notes,
				createdById: actor.id
			})
			.run();
		recordAudit(
			actor,
			{
				action: 'vessel.kla_point_added',
				subjectType: 'vessel',
				subjectId: vesselId,
				detail: {
					pointId: id,
					method: form.method,
					kLaPerH: Number(measured.kLaPerH.toPrecision(4)),
					agitationRpm: form.agitationRpm,
					gasFlowLPerMin: form.gasFlowLPerMin,
					measuredOn: form.measuredOn
				}
			},
			tx
		);
	});
	return { id, measured };
}

/** Takes a wrong point off the map, with the reason; the trail keeps what it was. */
export function removeKlaPoint(actor: Actor, vesselId: string, pointId: string, reason: string) {
	const why = reason.trim();
	if (!why) throw new RuleError('Say why the point is removed.', { field: 'reason' });
	db.transaction((tx) => {
		const point = tx
			.select()
			.from(vesselKlaPoint)
			.where(and(eq(vesselKlaPoint.id, pointId), eq(vesselKlaPoint.vesselId, vesselId)))
			.get();
		if (!point) throw new RuleError('That point is not on this vessel’s map.', { status: 404 });
		tx.delete(vesselKlaPoint).where(eq(vesselKlaPoint.id, pointId)).run();
		const { readings: _readings, ...kept } = point;
		recordAudit(
			actor,
			{
				action: 'vessel.kla_point_removed',
				subjectType: 'vessel',
				subjectId: vesselId,
				detail: {
					reason: why,
					kLaPerH: Number(point.kLaPerH.toPrecision(4)),
					measuredOn: point.measuredOn,
					point: { ...kept, createdAt: point.createdAt.toISOString() }
				}
			},
			tx
		);
	});
}
