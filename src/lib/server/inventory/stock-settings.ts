import { and, eq } from 'drizzle-orm';
import { recordAudit } from '../audit';
import { db } from '../db';
import { component, lot } from '../db/schema';
import { RuleError } from '../rule-error';
import type { SignedActor } from './lots';

/**
 * The stock settings of a component: the reorder level in grams (empty clears it) and the density
 * that lets a liquid be received by volume (it cannot be cleared while volume lots exist).
 */
export function setStockSettings(
	actor: SignedActor,
	componentId: string,
	input: { reorderLevelG: number | null; densityGPerMl: number | null }
): void {
	const { reorderLevelG, densityGPerMl } = input;
	if (reorderLevelG !== null && (!Number.isFinite(reorderLevelG) || reorderLevelG < 0)) {
		throw new RuleError('The reorder level must be a number of grams from 0 up, or empty.', {
			field: 'reorderLevelG'
		});
	}
	if (
		densityGPerMl !== null &&
		(!Number.isFinite(densityGPerMl) || densityGPerMl <= 0 || densityGPerMl > 25)
	) {
		throw new RuleError(
			'The density must be a number of g/mL above 0 (and at most 25), or empty.',
			{ field: 'densityGPerMl' }
		);
	}
	db.transaction((tx) => {
		const found = tx.select().from(component).where(eq(component.id, componentId)).get();
		if (!found)
			throw new RuleError('No component with this id.', { status: 404, field: 'componentId' });
		if (densityGPerMl === null && found.densityGPerMl !== null) {
			const volumeLot = tx
				.select({ code: lot.code })
				.from(lot)
				.where(and(eq(lot.componentId, componentId), eq(lot.quantityKind, 'volume')))
				.get();
			if (volumeLot)
				throw new RuleError(
					`Lot ${volumeLot.code} of ${found.name} is kept by volume, so its density must stay.`,
					{ field: 'densityGPerMl' }
				);
		}
		tx.update(component)
			.set({ reorderLevelG, densityGPerMl, updatedAt: new Date() })
			.where(eq(component.id, componentId))
			.run();
		recordAudit(
			actor,
			{
				action: 'component.stock_settings_set',
				subjectType: 'component',
				subjectId: componentId,
				detail: {
					reorderLevelG: { from: found.reorderLevelG, to: reorderLevelG },
					densityGPerMl: { from: found.densityGPerMl, to: densityGPerMl }
				}
			},
			tx
		);
	});
}
