import { checkBatchInput, createBatch } from '$lib/server/batches/create';
import { completeBatch } from '$lib/server/batches/completion';
import { recordLine } from '$lib/server/batches/line-record';
import { chooseLot } from '$lib/server/batches/lot-choice';
import { reviewBatch } from '$lib/server/batches/review';
import { buildSheetLines } from '$lib/server/batches/sheet';
import { rolesOf } from '$lib/server/people';
import { makeApprovedRecipe, today } from './inventory-fixtures';

type Person = { id: string; email: string; password: string };

/** A batch planned today through the same check the form uses. */
export function planBatch(planner: Person, recipeId: string, volumeL = 1, intendedUse = 'Test') {
	const checked = checkBatchInput({
		recipeId,
		targetVolumeL: volumeL,
		plannedOn: today,
		intendedUse
	});
	if (!checked.ok) throw new Error(JSON.stringify(checked.fieldErrors));
	return createBatch(planner, checked.value);
}

/**
 * A batch made at the bench: each line takes the lot (or stock batch) code given for it and exactly
 * what it needs, then the technician signs it as prepared and, when a reviewer is given, they release it.
 */
export async function makeBatch(
	tech: Person,
	recipeId: string,
	volumeL: number,
	codesByLine: string[],
	reviewer?: Person
) {
	const b = planBatch(tech, recipeId, volumeL, 'Made by a test');
	buildSheetLines(b).forEach((line, i) => {
		chooseLot(tech, b.id, line.id, codesByLine[i]);
		const now = buildSheetLines(b).find((l) => l.id === line.id)!;
		recordLine(tech, b.id, line.id, { actualText: now.requiredText.replace(/ (g|mL)$/, '') });
	});
	await completeBatch(tech, b.id, { password: tech.password });
	if (reviewer)
		await reviewBatch({ ...reviewer, roles: rolesOf(reviewer.id) }, b.id, {
			decision: 'released',
			password: reviewer.password,
			reason: 'Complete.'
		});
	return b;
}

/**
 * A 100 g/L magnesium sulfate stock solution (with this shelf life, '' for none) and a medium that
 * doses it at 2 mL/L beside 5 g/L sodium chloride, both approved.
 */
export async function stockAndMedium(shelfLifeDays: string) {
	const stockRecipe = await makeApprovedRecipe(
		[{ componentId: 'magnesium-sulfate', amount: 100, unit: 'g/L' }],
		{ shelfLifeDays },
		[],
		'stock_solution'
	);
	const medium = await makeApprovedRecipe(
		[{ componentId: 'sodium-chloride', amount: 5, unit: 'g/L' }],
		{},
		[{ stockRecipeId: stockRecipe.recipeId, amount: 2 }]
	);
	return { stockRecipe, medium };
}
