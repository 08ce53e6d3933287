// Whoever changed a recipe version, by any route, may not review or approve it: the list of editors
// is kept by database triggers (recipe_version_editor), and a trigger refuses their signature.
import { eq, sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { listAuditEvents } from '$lib/server/audit';
import { db } from '$lib/server/db';
import { eSignature } from '$lib/server/db/schema';
import { importLineCsv } from '$lib/server/recipes/csv';
import { checkDraft } from '$lib/server/recipes/draft';
import { saveDraft, startDraftFrom } from '$lib/server/recipes/drafts';
import { editorIdsOf, findVersionById } from '$lib/server/recipes/queries';
import { signVersion, submitForReview } from '$lib/server/recipes/workflow';
import { nextLink } from '$lib/server/trail/chain';
import { makeUser, refusalOf } from './helpers';
import { draftRecipe, EMPTY_FIELDS, line } from './recipes-fixtures';

type Person = Awaited<ReturnType<typeof makeUser>>;
let author: Person;
let second: Person;
let engineer: Person;

beforeAll(async () => {
	author = await makeUser(['media_scientist']);
	second = await makeUser(['media_scientist']);
	engineer = await makeUser(['engineer']);
});

const signer = (p: Person) => ({ id: p.id, email: p.email, roles: p.roles });

async function expectSigningRefused(versionId: string, person: Person) {
	const before = listAuditEvents({ action: 'signature.refused', page: 1, pageSize: 500 }).rows
		.length;
	for (const meaning of ['reviewed', 'approved'] as const) {
		const error = await refusalOf(() =>
			signVersion(signer(person), versionId, { password: person.password, meaning, comment: '' })
		);
		expect(error.status).toBe(403);
		expect(error.message).toMatch(/You (wrote|edited) this version/);
	}
	const refusals = listAuditEvents({ action: 'signature.refused', page: 1, pageSize: 500 }).rows;
	expect(refusals.length).toBe(before + 2);
	expect(refusals.some((e) => e.subjectId === versionId && e.actorId === person.id)).toBe(true);
	expect(findVersionById(versionId)?.status).toBe('in_review');
	expect(db.select().from(eSignature).where(eq(eSignature.subjectId, versionId)).all()).toEqual([]);
}

describe('separation of duties is held by the data', () => {
	it('a CSV import into another author’s draft makes the importer an editor who cannot sign', async () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		const version = findVersionById(draft.versionId)!;
		importLineCsv(second, version, 'component,amount,unit\nD-Glucose,50,g/L\n', 'append');
		expect(editorIdsOf(draft.versionId).sort()).toEqual([author.id, second.id].sort());
		submitForReview(second, draft.versionId, findVersionById(draft.versionId)!.revision);
		await expectSigningRefused(draft.versionId, second);
		await signVersion(signer(engineer), draft.versionId, {
			password: engineer.password,
			meaning: 'approved',
			comment: ''
		});
		expect(findVersionById(draft.versionId)?.status).toBe('approved');
	});

	it('an editor save by a second person makes them an editor', async () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		const checked = checkDraft({ fields: EMPTY_FIELDS, lines: [line('sodium-chloride', 7)] }, null);
		if (!checked.ok) throw new Error('bad draft');
		saveDraft(second, draft.versionId, draft.revision, checked.value);
		submitForReview(author, draft.versionId, findVersionById(draft.versionId)!.revision);
		await expectSigningRefused(draft.versionId, second);
	});

	it('whoever starts a new draft from an approved version is its author and cannot sign it', async () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		submitForReview(author, draft.versionId, draft.revision);
		await signVersion(signer(engineer), draft.versionId, {
			password: engineer.password,
			meaning: 'approved',
			comment: ''
		});
		const next = startDraftFrom(second, draft.versionId);
		expect(editorIdsOf(next.id)).toEqual([second.id]);
		submitForReview(second, next.id, next.revision);
		await expectSigningRefused(next.id, second);
	});

	it('the database refuses a signature row from an editor, whatever wrote it', () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		// A row that continues the signature chain correctly, so the editor rule is what refuses it.
		const row = {
			id: crypto.randomUUID(),
			signer_id: author.id,
			signer_email: author.email,
			signer_name: 'x',
			meaning: 'approved',
			subject_type: 'recipe_version',
			subject_id: draft.versionId,
			subject_digest: null,
			comment: '',
			signed_at: 0
		};
		const link = nextLink(db.$client, 'e_signature', row);
		let refusal = 'accepted';
		try {
			db.$client
				.prepare(
					`insert into e_signature (id, signer_id, signer_email, signer_name, meaning, subject_type,
					subject_id, subject_digest, comment, signed_at, seq, prev_hash, row_hash)
					values (@id, @signer_id, @signer_email, @signer_name, @meaning, @subject_type,
					@subject_id, @subject_digest, @comment, @signed_at, @seq, @prevHash, @rowHash)`
				)
				.run({ ...row, ...link });
		} catch (error) {
			refusal = (error as Error).message;
		}
		expect(refusal).toMatch(/whoever changed a recipe version may not sign it/);
	});

	it('the list of editors cannot be rewritten', () => {
		const draft = draftRecipe(author, [line('sodium-chloride', 5)]);
		expect(() =>
			db.run(sql`delete from recipe_version_editor where version_id = ${draft.versionId}`)
		).toThrow();
		expect(() =>
			db.run(
				sql`update recipe_version_editor set user_id = ${engineer.id} where version_id = ${draft.versionId}`
			)
		).toThrow();
		expect(editorIdsOf(draft.versionId)).toEqual([author.id]);
	});
});
