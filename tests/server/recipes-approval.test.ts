import { eq, sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { listAuditEvents } from '$lib/server/audit';
import { db } from '$lib/server/db';
import { eSignature, recipeLine, recipeVersion } from '$lib/server/db/schema';
import { checkDraft } from '$lib/server/recipes/draft';
import { saveDraft, startDraftFrom, StaleEditError } from '$lib/server/recipes/drafts';
import { findVersion, findVersionById, linesOf } from '$lib/server/recipes/queries';
import {
	retireVersion,
	signingRefusal,
	signVersion,
	submitForReview
} from '$lib/server/recipes/workflow';
import { makeUser, refusalOf } from './helpers';
import { draftRecipe, EMPTY_FIELDS, line } from './recipes-fixtures';

/** Drizzle wraps the driver's error; the trigger's own words are in its cause. */
function failureOf(run: () => unknown): string {
	try {
		run();
	} catch (error) {
		const cause = (error as { cause?: Error }).cause;
		return `${(error as Error).message} | ${cause?.message ?? ''}`;
	}
	return 'no error';
}

type Person = Awaited<ReturnType<typeof makeUser>>;
let author: Person;
let engineer: Person;
let otherScientist: Person;
let technician: Person;

beforeAll(async () => {
	author = await makeUser(['media_scientist']);
	engineer = await makeUser(['engineer']);
	otherScientist = await makeUser(['media_scientist']);
	technician = await makeUser(['prep_technician']);
});

const signer = (p: Person) => ({ id: p.id, email: p.email, roles: p.roles });

function submittedRecipe() {
	const draft = draftRecipe(author, [line('sodium-chloride', 5), line('d-glucose', 20, 'mM')]);
	submitForReview(author, draft.versionId, draft.revision);
	return draft;
}

function signaturesOf(versionId: string) {
	return db.select().from(eSignature).where(eq(eSignature.subjectId, versionId)).all();
}

describe('approval needs a second person with a signature', () => {
	it('refuses the author, even with the right password, and records nothing', async () => {
		const { versionId } = submittedRecipe();
		const error = await refusalOf(() =>
			signVersion(signer(author), versionId, {
				password: author.password,
				meaning: 'approved',
				comment: ''
			})
		);
		expect(error.status).toBe(403);
		expect(error.message).toBe(
			'You wrote this version, so someone else must review and approve it.'
		);
		expect(findVersionById(versionId)?.status).toBe('in_review');
		expect(signaturesOf(versionId)).toHaveLength(0);
	});

	it('refuses a prep technician, who holds neither approving role', async () => {
		const { versionId } = submittedRecipe();
		expect(signingRefusal(signer(technician), findVersionById(versionId)!)).toMatch(
			/Media scientist or Process engineer/
		);
		const error = await refusalOf(() =>
			signVersion(signer(technician), versionId, {
				password: technician.password,
				meaning: 'approved',
				comment: ''
			})
		);
		expect(error.status).toBe(403);
		expect(findVersionById(versionId)?.status).toBe('in_review');
	});

	it('refuses a wrong password with a field error, signs nothing and audits the attempt', async () => {
		const { versionId } = submittedRecipe();
		const error = await refusalOf(() =>
			signVersion(signer(engineer), versionId, {
				password: 'not-my-password',
				meaning: 'approved',
				comment: ''
			})
		);
		expect(error.field).toBe('password');
		expect(error.message).toMatch(/password is not right/);
		expect(signaturesOf(versionId)).toHaveLength(0);
		expect(findVersionById(versionId)?.status).toBe('in_review');
		expect(
			listAuditEvents({ action: 'signature.refused', actor: engineer.email, page: 1, pageSize: 10 })
				.total
		).toBeGreaterThan(0);
	});

	it('a review signature keeps the version in review; an approval signature releases it', async () => {
		const { versionId } = submittedRecipe();
		await signVersion(signer(otherScientist), versionId, {
			password: otherScientist.password,
			meaning: 'reviewed',
			comment: 'Looks right'
		});
		expect(findVersionById(versionId)?.status).toBe('in_review');
		await signVersion(signer(engineer), versionId, {
			password: engineer.password,
			meaning: 'approved',
			comment: ''
		});
		const version = findVersionById(versionId)!;
		expect(version.status).toBe('approved');
		expect(version.approvedById).toBe(engineer.id);
		const signatures = signaturesOf(versionId);
		expect(signatures.map((s) => [s.meaning, s.signerEmail])).toEqual([
			['reviewed', otherScientist.email],
			['approved', engineer.email]
		]);
		expect(signatures[1].signerName).toBe(`Person ${engineer.email.match(/person(\d+)/)![1]}`);
		expect(signatures[1].signedAt).toBeInstanceOf(Date);
		expect(signatures[1].subjectDigest).toMatch(/^[0-9a-f]{64}$/);
		const actions = listAuditEvents({ action: 'recipe.', page: 1, pageSize: 100 })
			.rows.filter((e) => e.subjectId === versionId)
			.map((e) => e.action);
		expect(actions).toEqual(
			expect.arrayContaining([
				'recipe.draft_saved',
				'recipe.submitted',
				'recipe.reviewed',
				'recipe.approved'
			])
		);
	});

	it('refuses someone who edited the draft, though not its author', async () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		const checked = checkDraft(
			{ fields: EMPTY_FIELDS, lines: [line('sodium-chloride', 6)] },
			draft.recipeId
		);
		if (!checked.ok) throw new Error('bad draft');
		const revision = saveDraft(otherScientist, draft.versionId, draft.revision, checked.value);
		submitForReview(author, draft.versionId, revision);
		const error = await refusalOf(() =>
			signVersion(signer(otherScientist), draft.versionId, {
				password: otherScientist.password,
				meaning: 'approved',
				comment: ''
			})
		);
		expect(error.message).toMatch(/You edited this version/);
	});
});

describe('an approved version cannot change, in the database too', () => {
	async function approved() {
		const draft = submittedRecipe();
		await signVersion(signer(engineer), draft.versionId, {
			password: engineer.password,
			meaning: 'approved',
			comment: ''
		});
		return draft;
	}

	it('the application refuses to save over it', async () => {
		const { versionId, revision, checked } = await approved();
		expect(() => saveDraft(author, versionId, revision, checked)).toThrow(
			/approved and can no longer be edited/
		);
	});

	it('triggers refuse UPDATE of its content and any change to its lines', async () => {
		const { versionId } = await approved();
		expect(
			failureOf(() =>
				db.run(sql`update recipe_version set instructions = 'changed' where id = ${versionId}`)
			)
		).toMatch(/cannot change/);
		expect(
			failureOf(() =>
				db.run(sql`update recipe_version set status = 'draft' where id = ${versionId}`)
			)
		).toMatch(/cannot change/);
		expect(
			failureOf(() =>
				db.update(recipeLine).set({ amount: 99 }).where(eq(recipeLine.versionId, versionId)).run()
			)
		).toMatch(/UPDATE is refused/);
		expect(
			failureOf(() => db.delete(recipeLine).where(eq(recipeLine.versionId, versionId)).run())
		).toMatch(/DELETE is refused/);
		expect(
			failureOf(() =>
				db
					.insert(recipeLine)
					.values({
						versionId,
						position: 9,
						kind: 'component',
						componentId: 'potassium-chloride',
						amount: 1,
						unit: 'g/L'
					})
					.run()
			)
		).toMatch(/INSERT is refused/);
		expect(
			failureOf(() => db.delete(recipeVersion).where(eq(recipeVersion.id, versionId)).run())
		).toMatch(/cannot be deleted/);
		expect(findVersionById(versionId)?.instructions).toBe('Dissolve in order.');
		expect(linesOf(versionId).map((l) => l.amount)).toEqual([5, 20]);
	});

	it('allows only approved → retired, and nothing after', async () => {
		const { versionId } = await approved();
		retireVersion(author, versionId, 'replaced');
		expect(findVersionById(versionId)?.status).toBe('retired');
		expect(
			failureOf(() =>
				db.run(sql`update recipe_version set status = 'approved' where id = ${versionId}`)
			)
		).toMatch(/cannot change/);
	});

	it('signatures are append-only', async () => {
		const { versionId } = await approved();
		expect(
			failureOf(() =>
				db.run(sql`update e_signature set meaning = 'reviewed' where subject_id = ${versionId}`)
			)
		).toMatch(/append-only: UPDATE/);
		expect(
			failureOf(() => db.run(sql`delete from e_signature where subject_id = ${versionId}`))
		).toMatch(/append-only: DELETE/);
		expect(signaturesOf(versionId)).toHaveLength(1);
	});

	it('a new draft starts from it; approving that draft retires the old version', async () => {
		const { recipeId, versionId } = await approved();
		const next = startDraftFrom(author, versionId);
		expect(next.n).toBe(2);
		expect(next.basedOnVersionId).toBe(versionId);
		expect(linesOf(next.id).map((l) => l.componentId)).toEqual(['sodium-chloride', 'd-glucose']);
		expect(() => startDraftFrom(author, versionId)).toThrow(/Version 2 is still draft/);
		submitForReview(author, next.id, next.revision);
		await signVersion(signer(engineer), next.id, {
			password: engineer.password,
			meaning: 'approved',
			comment: ''
		});
		expect(findVersion(recipeId, 1)?.status).toBe('retired');
		expect(findVersion(recipeId, 2)?.status).toBe('approved');
	});
});

describe('a stale edit is refused', () => {
	it('the second save from the same revision is refused and carries the first person’s lines', () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		const mine = checkDraft(
			{ fields: EMPTY_FIELDS, lines: [line('sodium-chloride', 7)] },
			draft.recipeId
		);
		const theirs = checkDraft(
			{
				fields: EMPTY_FIELDS,
				lines: [line('sodium-chloride', 5), line('potassium-chloride', 0.4)]
			},
			draft.recipeId
		);
		if (!mine.ok || !theirs.ok) throw new Error('bad draft');
		saveDraft(otherScientist, draft.versionId, draft.revision, theirs.value);
		let stale: StaleEditError | undefined;
		try {
			saveDraft(author, draft.versionId, draft.revision, mine.value);
		} catch (error) {
			if (error instanceof StaleEditError) stale = error;
		}
		expect(stale?.status).toBe(409);
		expect(stale?.theirs.byName).toMatch(/^Person/);
		expect(stale?.theirs.lines.map((l) => [l.componentName, l.amount])).toEqual([
			['Sodium chloride', 5],
			['Potassium chloride', 0.4]
		]);
		expect(linesOf(draft.versionId).map((l) => l.amount)).toEqual([5, 0.4]);
	});
});
