// Approval sees what the analysis sees: a version with a solubility warning and an osmolality
// estimate below its range is signed only when each warning is acknowledged with a comment, and the
// acknowledgements are written into the signature itself.
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { eSignature } from '$lib/server/db/schema';
import { findVersionById } from '$lib/server/recipes/queries';
import { openWarnings } from '$lib/server/recipes/open-warnings';
import { signVersion, submitForReview } from '$lib/server/recipes/workflow';
import { makeUser, refusalOf } from './helpers';
import { draftRecipe, line } from './recipes-fixtures';

type Person = Awaited<ReturnType<typeof makeUser>>;
let author: Person;
let engineer: Person;

beforeAll(async () => {
	author = await makeUser(['media_scientist']);
	engineer = await makeUser(['engineer']);
});

const signer = (p: Person) => ({ id: p.id, email: p.email, roles: p.roles });

/**
 * Calcium sulfate dihydrate at 60 g/L: gypsum dissolves to about 2.4 g/L at 25 °C (CRC Handbook,
 * from memory; the library's own solubility points decide the warning). The osmolality estimate
 * counts what is weighed as dissolved: 60 / 172.17 g/mol = 0.35 mol/kg, two ions each, is already
 * about 700 mOsm/kg ideal before the osmotic coefficient (hand calculation), well above 280–320.
 */
function versionWithWarnings() {
	const draft = draftRecipe(
		author,
		[line('sodium-chloride', 1), line('calcium-sulfate-dihydrate', 60)],
		'basal',
		{ osmolalityMinMOsmPerKg: '280', osmolalityMaxMOsmPerKg: '320' }
	);
	submitForReview(author, draft.versionId, draft.revision);
	return findVersionById(draft.versionId)!;
}

const signaturesOf = (versionId: string) =>
	db.select().from(eSignature).where(eq(eSignature.subjectId, versionId)).all();

describe('signing a version with open warnings', () => {
	it('lists the solubility warning and the osmolality outside its range', () => {
		const warnings = openWarnings(versionWithWarnings());
		expect(warnings.map((w) => w.kind).sort()).toEqual(['osmolality', 'solubility']);
		expect(warnings.find((w) => w.kind === 'osmolality')!.message).toMatch(
			/is above the version’s range of 280–320 mOsm\/kg/
		);
		expect(warnings.find((w) => w.kind === 'solubility')!.message).toMatch(/[Cc]alcium sulfate/);
	});

	it('refuses a signature until every warning is acknowledged, each at its own field', async () => {
		const version = versionWithWarnings();
		const [first, second] = openWarnings(version);
		const none = await refusalOf(() =>
			signVersion(signer(engineer), version.id, {
				password: engineer.password,
				meaning: 'approved',
				comment: ''
			})
		);
		expect(none.message).toBe(
			'2 warnings are not acknowledged: say for each why it is acceptable, then sign.'
		);
		expect(Object.keys(none.fieldErrors!).sort()).toEqual(
			[`ack.${first.key}`, `ack.${second.key}`].sort()
		);
		const one = await refusalOf(() =>
			signVersion(signer(engineer), version.id, {
				password: engineer.password,
				meaning: 'approved',
				comment: '',
				acknowledgements: { [first.key]: 'Dosed as a suspension on purpose.', [second.key]: '  ' }
			})
		);
		expect(one.fieldErrors).toEqual({
			[`ack.${second.key}`]: ['Say why this is acceptable before signing.']
		});
		expect(signaturesOf(version.id)).toEqual([]);
		expect(findVersionById(version.id)!.status).toBe('in_review');
	});

	it('writes each warning with its acknowledgement into the signature', async () => {
		const version = versionWithWarnings();
		const warnings = openWarnings(version);
		await signVersion(signer(engineer), version.id, {
			password: engineer.password,
			meaning: 'approved',
			comment: 'Test medium only.',
			acknowledgements: Object.fromEntries(
				warnings.map((w) => [w.key, `Accepted for the ${w.kind} test.`])
			)
		});
		expect(findVersionById(version.id)!.status).toBe('approved');
		const [signature] = signaturesOf(version.id);
		expect(signature.comment.startsWith('Test medium only.\n\nWarnings acknowledged:\n')).toBe(
			true
		);
		for (const w of warnings)
			expect(signature.comment).toContain(
				`- ${w.message} Acknowledged: Accepted for the ${w.kind} test.`
			);
	});
});
