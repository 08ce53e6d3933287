import { eq } from 'drizzle-orm';
import { readDecimalText } from '$lib/number-reading';
import { recordAudit } from '../audit';
import { db } from '../db';
import { batch, batchDeviation, type RecipeVersion as Version } from '../db/schema';
import { findVersionById } from '../recipes/queries';
import { RuleError } from '../rule-error';
import { markStarted, requireBatch, requireOpen, type Technician } from './execution';
import { phRange } from './sheet';

export interface MeasurementInput {
	ph: string;
	osmolality: string;
	phReason?: string;
	osmolalityReason?: string;
}

interface MeasurementDeviation {
	kind: 'ph' | 'osmolality';
	detail: string;
	reason: string;
	field: string;
}

function readMeasurement(text: string, field: string, label: string): number | null {
	if (!text.trim()) return null;
	const parsed = readDecimalText(text, label);
	if (!parsed.ok) throw new RuleError(parsed.message, { field });
	return parsed.value;
}

/** The typed pH and osmolality, in their ranges, present where the recipe sets a target. */
function readMeasurements(
	input: MeasurementInput,
	version: Version
): { ph: number | null; osmolality: number | null } {
	const ph = readMeasurement(input.ph, 'ph', 'Measured pH');
	const osmolality = readMeasurement(input.osmolality, 'osmolality', 'Measured osmolality');
	if (ph !== null && (ph < 0 || ph > 14))
		throw new RuleError('A pH is between 0 and 14.', { field: 'ph' });
	if (osmolality !== null && (osmolality <= 0 || osmolality > 5000))
		throw new RuleError('An osmolality is above 0 and at most 5000 mOsm/kg.', {
			field: 'osmolality'
		});
	if (phRange(version.targetPh) && ph === null)
		throw new RuleError('Enter the measured pH.', { field: 'ph' });
	if (hasOsmolalityTarget(version) && osmolality === null)
		throw new RuleError('Enter the measured osmolality.', { field: 'osmolality' });
	return { ph, osmolality };
}

function hasOsmolalityTarget(version: Version): boolean {
	return version.osmolalityMinMOsmPerKg !== null || version.osmolalityMaxMOsmPerKg !== null;
}

/** Each measurement outside the recipe's range, with the reason typed for it. */
function measurementDeviations(
	measured: { ph: number | null; osmolality: number | null },
	version: Version,
	input: MeasurementInput
): MeasurementDeviation[] {
	const { ph, osmolality } = measured;
	const range = phRange(version.targetPh);
	const deviations: MeasurementDeviation[] = [];
	if (range && ph !== null && (ph < range.min || ph > range.max)) {
		deviations.push({
			kind: 'ph',
			detail: `pH ${ph} outside ${range.min}–${range.max} (target ${version.targetPh} ± 0.2, common practice).`,
			reason: (input.phReason ?? '').trim(),
			field: 'phReason'
		});
	}
	if (osmolality !== null && hasOsmolalityTarget(version)) {
		const min = version.osmolalityMinMOsmPerKg ?? -Infinity;
		const max = version.osmolalityMaxMOsmPerKg ?? Infinity;
		if (osmolality < min || osmolality > max) {
			deviations.push({
				kind: 'osmolality',
				detail: `Osmolality ${osmolality} mOsm/kg outside ${version.osmolalityMinMOsmPerKg ?? '…'}–${version.osmolalityMaxMOsmPerKg ?? '…'} mOsm/kg.`,
				reason: (input.osmolalityReason ?? '').trim(),
				field: 'osmolalityReason'
			});
		}
	}
	return deviations;
}

/** The measured pH and osmolality, checked against the recipe's range; out of range needs a reason. */
export function recordMeasurements(
	actor: Technician,
	batchId: string,
	input: MeasurementInput
): void {
	db.transaction((tx) => {
		const b = requireBatch(batchId, tx);
		requireOpen(b);
		const version = findVersionById(b.versionId, tx)!;
		const { ph, osmolality } = readMeasurements(input, version);
		const deviations = measurementDeviations({ ph, osmolality }, version, input);
		for (const d of deviations) {
			if (d.reason.length < 3)
				throw new RuleError(`${d.detail} Give the reason; it is recorded as a deviation.`, {
					field: d.field,
					status: 422
				});
		}
		for (const d of deviations)
			tx.insert(batchDeviation)
				.values({
					batchId: b.id,
					kind: d.kind,
					detail: d.detail,
					reason: d.reason,
					recordedById: actor.id
				})
				.run();
		markStarted(tx, actor, b);
		tx.update(batch)
			.set({ measuredPh: ph, measuredOsmolality: osmolality })
			.where(eq(batch.id, b.id))
			.run();
		recordAudit(
			actor,
			{
				action: 'batch.measured',
				subjectType: 'batch',
				subjectId: b.id,
				detail: { ph, osmolality, deviations: deviations.length }
			},
			tx
		);
	});
}
