import { count, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { REFERENCE_COMPONENTS } from '$chemistry';
import { db } from '$lib/server/db';
import { component, eSignature, recipe, recipeVersion, user } from '$lib/server/db/schema';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { seedDemo } from '$lib/server/demo/seed';
import { versionView } from '$lib/server/recipes/view';

describe('the starting library and the demo recipes', () => {
	it('loads the reference components once, and the demo recipes once', async () => {
		expect(seedReferenceLibrary()).toBe(REFERENCE_COMPONENTS.length);
		expect(seedReferenceLibrary()).toBe(0);
		expect(db.select({ n: count() }).from(component).get()!.n).toBe(REFERENCE_COMPONENTS.length);

		expect(await seedDemo()).toBeGreaterThan(0);
		const before = db.select({ n: count() }).from(recipeVersion).get()!.n;
		expect(await seedDemo()).toBe(0);
		expect(db.select({ n: count() }).from(recipeVersion).get()!.n).toBe(before);

		const recipes = db.select().from(recipe).all();
		expect(recipes.length).toBeGreaterThanOrEqual(6);
		const statuses = db
			.select({ status: recipeVersion.status })
			.from(recipeVersion)
			.all()
			.map((v) => v.status);
		expect(statuses).toEqual(expect.arrayContaining(['approved', 'draft', 'in_review']));
	});
});

describe('the demo recipes, once seeded', () => {
	// Each test here stands alone: seeding is idempotent, so running one of them by itself still finds the demo.
	beforeAll(async () => {
		seedReferenceLibrary();
		await seedDemo();
	});

	it('each approval is signed by someone other than the author', () => {
		const approved = db
			.select()
			.from(recipeVersion)
			.where(eq(recipeVersion.status, 'approved'))
			.all();
		expect(approved.length).toBeGreaterThanOrEqual(3);
		for (const version of approved) {
			const signatures = db
				.select()
				.from(eSignature)
				.where(eq(eSignature.subjectId, version.id))
				.all();
			expect(signatures.map((s) => s.meaning)).toContain('approved');
			expect(signatures.every((s) => s.signerId !== version.authorId)).toBe(true);
		}
		const engineer = db.select().from(user).where(eq(user.email, 'engineer@demo.test')).get()!;
		expect(approved.every((v) => v.approvedById === engineer.id)).toBe(true);
	});

	it('the feed shows its solubility problem, and the trace stock is used by others', () => {
		const feed = db.select().from(recipe).where(eq(recipe.name, 'PPN Feed GA-12')).get()!;
		expect(
			versionView(feed.id, 1)
				.analysis?.warnings.map((w) => w.message)
				.join(' ')
		).toMatch(/L-Tyrosine at 3 g\/L exceeds its solubility/);
		const basal = db.select().from(recipe).where(eq(recipe.name, 'PPN CD Basal M1')).get()!;
		const view = versionView(basal.id, 1);
		expect(view.lines.find((l) => l.kind === 'stock')?.stockRecipeName).toBe(
			'PPN Trace Elements T2'
		);
		expect(view.analysis?.elements.find((e) => e.symbol === 'Zn')?.gPerL).toBeGreaterThan(0);
		expect(view.analysis?.osmolality.verdict).toBe('within');
		expect(view.analysis?.warnings).toEqual([]);
	});
});
