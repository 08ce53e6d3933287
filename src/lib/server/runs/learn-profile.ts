// Growth values fitted to a run saved to its organism profile as the profile's next revision,
// audited with the run as their source.
import { eq } from 'drizzle-orm';
import { changesBetween, recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { organismProfile, type RunRow } from '../db/schema';
import { RuleError } from '../rule-error';
import { analyseRun } from './run-analysis';

export const LEARNABLE_FIELDS = ['muMaxPerH', 'yieldXSGPerG', 'yieldXO2GPerG'] as const;
export type LearnableField = (typeof LEARNABLE_FIELDS)[number];

const FIELD_WORDS: Record<LearnableField, string> = {
	muMaxPerH: 'μmax',
	yieldXSGPerG: 'Yx/s',
	yieldXO2GPerG: 'Yx/O2'
};

/**
 * Recomputes the values from the stored data (never from what the page sent) and writes the chosen
 * ones to the run's profile. The profile's revision must be the one the person saw.
 */
export async function saveLearnedValues(
	actor: Actor,
	row: RunRow,
	fields: LearnableField[],
	seenRevision: number
): Promise<string[]> {
	if (!fields.length)
		throw new RuleError('Tick at least one value to save to the profile.', { field: 'fields' });
	const { learned } = await analyseRun(row);
	const values: Partial<Record<LearnableField, number>> = {};
	for (const field of fields) {
		const found = field === 'muMaxPerH' ? learned?.muMaxPerH.value?.value : learned?.[field].value;
		if (found === null || found === undefined || !Number.isFinite(found))
			throw new RuleError(`${FIELD_WORDS[field]} could not be fitted from this run's data.`, {
				field: 'fields'
			});
		values[field] = Number(found.toPrecision(4));
	}
	return db.transaction((tx) => {
		const current = tx
			.select()
			.from(organismProfile)
			.where(eq(organismProfile.id, row.profileId))
			.get();
		if (!current)
			throw new RuleError('The run’s organism profile no longer exists.', { status: 404 });
		if (current.revision !== seenRevision)
			throw new RuleError(
				'The profile was changed since this page was loaded. Reload to compare with its new values.',
				{ status: 409 }
			);
		const update = {
			...values,
			...(values.yieldXSGPerG !== undefined ? { yieldXSMethod: 'entered' as const } : {}),
			notes: `${current.notes}${current.notes ? '\n' : ''}${fields.map((f) => FIELD_WORDS[f]).join(', ')} fitted to run ${row.number} (${new Date().toISOString().slice(0, 10)}).`
		};
		tx.update(organismProfile)
			.set({ ...update, revision: current.revision + 1, updatedAt: new Date() })
			.where(eq(organismProfile.id, current.id))
			.run();
		recordAudit(
			actor,
			{
				action: 'profile.learned_from_run',
				subjectType: 'organism_profile',
				subjectId: current.id,
				detail: {
					runId: row.id,
					runNumber: row.number,
					fields: fields.map((f) => FIELD_WORDS[f]).join(', '),
					changes: changesBetween(current, update)
				}
			},
			tx
		);
		return fields.map((f) => FIELD_WORDS[f]);
	});
}
