import { eq } from 'drizzle-orm';
import { z } from 'zod';
import { MAX_KLA_PER_H, STUDY_TEMPERATURE_RANGE_C, VESSEL_KLA_MODES } from '$chemistry';
import { changesBetween, recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { vessel, type VesselRow } from '../db/schema';
import { RuleError } from '../rule-error';
import { checkbox, optionalNumber, optionalText, requiredNumber, requiredText } from './fields';

export const vesselSchema = z.object({
	name: requiredText('Name'),
	minWorkingVolumeL: requiredNumber('Minimum working volume', { gt: 0, unit: 'L' }),
	maxWorkingVolumeL: requiredNumber('Maximum working volume', { gt: 0, max: 100000, unit: 'L' }),
	kLaMode: z.enum(VESSEL_KLA_MODES, {
		error: 'Choose entered, correlation or the measured map'
	}),
	kLaPerH: optionalNumber('kLa', { gt: 0, max: MAX_KLA_PER_H, unit: '1/h' }),
	correlationK: optionalNumber('k', { gt: 0 }),
	correlationA: optionalNumber('a', { min: 0, max: 2 }),
	correlationB: optionalNumber('b', { min: 0, max: 2 }),
	powerPerVolumeWPerM3: optionalNumber('P/V', { gt: 0, max: 100000, unit: 'W/m³' }),
	superficialVelocityMPerS: optionalNumber('Superficial gas velocity', {
		gt: 0,
		max: 1,
		unit: 'm/s'
	}),
	maxGasFlowVvm: requiredNumber('Maximum gas flow', { gt: 0, max: 10, unit: 'vvm' }),
	o2EnrichmentAllowed: checkbox,
	maxPressureKPa: requiredNumber('Maximum pressure (absolute)', {
		min: 100,
		max: 1000,
		unit: 'kPa'
	}),
	temperatureC: requiredNumber('Temperature', {
		min: STUDY_TEMPERATURE_RANGE_C[0],
		max: STUDY_TEMPERATURE_RANGE_C[1],
		unit: '°C'
	}),
	coolingCapacityW: requiredNumber('Cooling capacity', { gt: 0, unit: 'W' }),
	agitationPowerW: optionalNumber('Agitation power', { min: 0, unit: 'W' }),
	vesselDiameterM: optionalNumber('Vessel inner diameter', { gt: 0, max: 20, unit: 'm' }),
	impellerDiameterM: optionalNumber('Impeller diameter', { gt: 0, max: 10, unit: 'm' }),
	impellerCount: requiredNumber('Number of impellers', { min: 1, max: 10 }).refine(
		(n) => Number.isInteger(n),
		'Number of impellers must be a whole number'
	),
	powerNumber: optionalNumber('Impeller power number', { gt: 0, max: 20 }),
	plannedAgitationRpm: optionalNumber('Planned stirrer speed', { gt: 0, max: 5000, unit: 'rpm' }),
	plannedGasFlowLPerMin: optionalNumber('Planned gas flow', { gt: 0, max: 100000, unit: 'L/min' }),
	notes: optionalText()
});

export type VesselForm = z.infer<typeof vesselSchema>;

export function checkVessel(form: VesselForm): VesselForm {
	if (form.minWorkingVolumeL >= form.maxWorkingVolumeL)
		throw new RuleError('The minimum working volume must be below the maximum.', {
			field: 'minWorkingVolumeL'
		});
	if (form.kLaMode === 'entered' && form.kLaPerH === null)
		throw new RuleError('Enter the kLa, or choose the correlation.', { field: 'kLaPerH' });
	if (
		form.impellerDiameterM !== null &&
		form.vesselDiameterM !== null &&
		form.impellerDiameterM >= form.vesselDiameterM
	)
		throw new RuleError('The impeller diameter must be smaller than the vessel diameter.', {
			field: 'impellerDiameterM'
		});
	if (form.kLaMode === 'map') {
		for (const [key, label] of [
			['vesselDiameterM', 'the vessel diameter'],
			['impellerDiameterM', 'the impeller diameter'],
			['plannedAgitationRpm', 'the planned stirrer speed'],
			['plannedGasFlowLPerMin', 'the planned gas flow']
		] as const) {
			if (form[key] === null)
				throw new RuleError(`The measured kLa map needs ${label} to give a study its kLa.`, {
					field: key
				});
		}
	}
	if (form.kLaMode === 'correlation') {
		for (const key of [
			'correlationK',
			'correlationA',
			'correlationB',
			'powerPerVolumeWPerM3',
			'superficialVelocityMPerS'
		] as const) {
			if (form[key] === null)
				throw new RuleError(
					'The correlation needs k, a, b, P/V and the superficial gas velocity.',
					{ field: key }
				);
		}
	}
	return form;
}

export function vesselFormValues(row: VesselRow): Record<string, string> {
	const values: Record<string, string> = {};
	for (const [k, v] of Object.entries(row))
		values[k] =
			v === null
				? ''
				: typeof v === 'boolean'
					? v
						? 'on'
						: ''
					: v instanceof Date
						? v.toISOString()
						: String(v);
	return values;
}

export function saveVessel(
	actor: Actor,
	id: string | null,
	revision: number | null,
	form: VesselForm,
	isDemo = false
): string {
	const values = checkVessel(form);
	return db.transaction((tx) => {
		const other = tx
			.select({ id: vessel.id })
			.from(vessel)
			.where(eq(vessel.name, values.name))
			.get();
		if (other && other.id !== id)
			throw new RuleError('A vessel with this name exists; choose another name.', {
				field: 'name',
				status: 409
			});
		if (id === null) {
			const newId = crypto.randomUUID();
			tx.insert(vessel)
				.values({ id: newId, ...values, isDemo })
				.run();
			recordAudit(
				actor,
				{
					action: 'vessel.created',
					subjectType: 'vessel',
					subjectId: newId,
					detail: { name: values.name }
				},
				tx
			);
			return newId;
		}
		const current = tx.select().from(vessel).where(eq(vessel.id, id)).get();
		if (!current) throw new RuleError('No such vessel.', { status: 404 });
		if (current.revision !== revision)
			throw new RuleError(
				'Someone else saved this vessel meanwhile. Reload to see their changes.',
				{ status: 409 }
			);
		tx.update(vessel)
			.set({ ...values, revision: current.revision + 1, updatedAt: new Date() })
			.where(eq(vessel.id, id))
			.run();
		recordAudit(
			actor,
			{
				action: 'vessel.updated',
				subjectType: 'vessel',
				subjectId: id,
				detail: { name: values.name, changes: changesBetween(current, values) }
			},
			tx
		);
		return id;
	});
}
