// What a lot holds: a received raw material (a library component), or a stock solution made here
// (a released stock-solution batch, kept by volume).
import { eq } from 'drizzle-orm';
import { db, type Db } from '../db';
import { batch, recipe, type Component, type Lot } from '../db/schema';
import { findComponent } from '../components/library';

type Reader = Pick<Db, 'select'>;

export interface LotMaterial {
	name: string;
	/** g/mL, for converting a weighed mass to a volume; null when unknown (always for a stock). */
	densityGPerMl: number | null;
	component: Component | null;
	/** The stock-solution recipe a made-here lot is, with the batch it came from. */
	stock: { recipeId: string; recipeName: string; batchId: string; batchNumber: string } | null;
}

export function materialOfLot(lotRow: Lot, reader: Reader = db): LotMaterial {
	if (lotRow.componentId) {
		const component = findComponent(lotRow.componentId, reader) ?? null;
		return {
			name: component?.name ?? lotRow.componentId,
			densityGPerMl: component?.densityGPerMl ?? null,
			component,
			stock: null
		};
	}
	const made = reader
		.select({
			batchId: batch.id,
			batchNumber: batch.number,
			recipeId: recipe.id,
			recipeName: recipe.name
		})
		.from(batch)
		.innerJoin(recipe, eq(recipe.id, batch.recipeId))
		.where(eq(batch.id, lotRow.sourceBatchId ?? ''))
		.get();
	return {
		name: made ? made.recipeName : lotRow.code,
		densityGPerMl: null,
		component: null,
		stock: made ?? null
	};
}
