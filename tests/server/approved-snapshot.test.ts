// An approved version means the same thing forever: it computes with the components as they were
// when it was submitted, and a later edit of the library reaches drafts only, with the author told.
import { beforeAll, describe, expect, it } from 'vitest';
import { auditEventsFor } from '$lib/server/audit';
import { checkBatchInput, createBatch } from '$lib/server/batches/create';
import { buildSheetLines } from '$lib/server/batches/sheet';
import { findComponent, updateComponent } from '$lib/server/components/library';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { analyseVersion } from '$lib/server/recipes/analysis';
import { startDraftFrom } from '$lib/server/recipes/drafts';
import { findVersionById } from '$lib/server/recipes/queries';
import { componentSnapshotOf, libraryChangesFor } from '$lib/server/recipes/snapshot';
import { versionDigest } from '$lib/server/recipes/workflow';
import { makeUser } from './helpers';
import { makeApprovedRecipe, today } from './inventory-fixtures';

// Molar masses from the IUPAC 2021 standard atomic weights (chemistry/REFERENCES.md):
// MgSO4 120.361, MgSO4·7H2O 246.466, MgSO4·6H2O 228.451 g/mol.
const HEPTAHYDRATE_PER_ANHYDROUS = 246.466 / 120.361;
const HEXAHYDRATE_PER_ANHYDROUS = 228.451 / 120.361;

let recipe: Awaited<ReturnType<typeof makeApprovedRecipe>>;
let librarian: Awaited<ReturnType<typeof makeUser>>;

function weighedGPerL(versionId: string): number {
	const analysis = analyseVersion(findVersionById(versionId)!);
	return analysis.components.find((c) => c.id === 'magnesium-sulfate-heptahydrate')!.gPerL;
}

beforeAll(async () => {
	seedReferenceLibrary();
	librarian = await makeUser(['media_scientist']);
	recipe = await makeApprovedRecipe([
		{
			componentId: 'magnesium-sulfate',
			shelfFormId: 'magnesium-sulfate-heptahydrate',
			amount: 0.2,
			unit: 'g/L'
		}
	]);
});

describe('an approved version keeps its components', () => {
	it('a component edit changes neither the approved version, nor its digest, nor a planned batch', async () => {
		const versionId = recipe.versionId;
		expect(weighedGPerL(versionId)).toBeCloseTo(0.2 * HEPTAHYDRATE_PER_ANHYDROUS, 4);
		const digestBefore = versionDigest(findVersionById(versionId)!);
		const checked = checkBatchInput({
			recipeId: recipe.recipeId,
			targetVolumeL: 1,
			plannedOn: today,
			intendedUse: 'Snapshot test'
		});
		if (!checked.ok) throw new Error(JSON.stringify(checked.fieldErrors));
		const planned = createBatch(librarian, checked.value);
		const sheetBefore = buildSheetLines(planned).map((l) => l.requiredText);
		expect(sheetBefore).toEqual(['409.5 mg']);

		const hydrate = findComponent('magnesium-sulfate-heptahydrate')!;
		const { id: _id, createdAt: _c, updatedAt: _u, revision, ...rest } = hydrate;
		updateComponent(librarian, hydrate.id, revision, { ...rest, formula: 'MgSO4·6H2O' });

		expect(weighedGPerL(versionId)).toBeCloseTo(0.2 * HEPTAHYDRATE_PER_ANHYDROUS, 4);
		expect(versionDigest(findVersionById(versionId)!)).toBe(digestBefore);
		expect(buildSheetLines(planned).map((l) => l.requiredText)).toEqual(sheetBefore);
		expect(componentSnapshotOf(versionId).get(hydrate.id)?.formula).toBe('MgSO4·7H2O');

		const entry = auditEventsFor('component', hydrate.id).find(
			(e) => e.action === 'component.updated'
		)!;
		expect(entry.detail?.changes).toEqual({
			formula: { from: 'MgSO4·7H2O', to: 'MgSO4·6H2O' }
		});

		expect(libraryChangesFor(findVersionById(versionId)!)).toEqual([
			{
				componentId: hydrate.id,
				name: hydrate.name,
				changes: { formula: { from: 'MgSO4·7H2O', to: 'MgSO4·6H2O' } }
			}
		]);

		// A new draft takes the library as it is now, and is told what changed since it was started.
		const author = await makeUser(['media_scientist']);
		const draft = startDraftFrom(author, versionId);
		expect(weighedGPerL(draft.id)).toBeCloseTo(0.2 * HEXAHYDRATE_PER_ANHYDROUS, 4);
		expect(componentSnapshotOf(draft.id).size).toBe(0);
		const again = findComponent(hydrate.id)!;
		updateComponent(librarian, hydrate.id, again.revision, {
			...rest,
			formula: 'MgSO4·7H2O'
		});
		expect(libraryChangesFor(findVersionById(draft.id)!)).toEqual([
			{
				componentId: hydrate.id,
				name: hydrate.name,
				changes: { formula: { from: 'MgSO4·6H2O', to: 'MgSO4·7H2O' } }
			}
		]);
	});
});
