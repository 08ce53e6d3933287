import { createHash } from 'node:crypto';
import { blankLine, type DraftFieldsInput } from '$lib/recipes';
import type { Role } from '$lib/roles';
import { addDays } from '$lib/server/inventory/alerts';
import type { CheckedUpload } from '$lib/server/inventory/certificates';
import { checkLotInput, type LotText } from '$lib/server/inventory/lot-input';
import { db } from '$lib/server/db';
import { lotDigest, LOT_SIGNATURE_MEANINGS } from '$lib/server/inventory/lot-signing';
import { applyLotStatus, findLot, receiveLot, type LotDecision } from '$lib/server/inventory/lots';
import { insertSignature } from '$lib/server/signatures';
import { rolesOf } from '$lib/server/people';
import { checkDraft } from '$lib/server/recipes/draft';
import { createRecipe, saveDraft } from '$lib/server/recipes/drafts';
import { findVersion } from '$lib/server/recipes/queries';
import { signVersion, submitForReview } from '$lib/server/recipes/workflow';
import { isoToday } from '$lib/inventory';
import { makeUser } from './helpers';

export const today = isoToday();

/** The smallest real PDF header a sniffer accepts. */
export const PDF_BYTES = new TextEncoder().encode(
	'%PDF-1.4\n%demo\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n'
);

export function pdfUpload(name = 'coa.pdf'): CheckedUpload {
	return {
		bytes: PDF_BYTES,
		displayName: name,
		mediaType: 'application/pdf',
		extension: 'pdf',
		sizeBytes: PDF_BYTES.length,
		sha256: createHash('sha256').update(PDF_BYTES).digest('hex')
	};
}

let counter = 0;

export async function makeLead() {
	const lead = await makeUser(['inventory_lead']);
	return { ...lead, actor: { id: lead.id, email: lead.email } };
}

/** A lot received (with a certificate) and, unless told otherwise, released. */
export function makeLot(
	lead: { id: string; email: string },
	overrides: LotText & { status?: 'quarantine' | 'released' } = {}
) {
	counter++;
	const { status = 'released', ...fields } = overrides;
	const checked = checkLotInput({
		component: 'sodium-chloride',
		supplier: 'Northfield Reagents',
		supplierLot: `T-${counter}-${crypto.randomUUID().slice(0, 6)}`,
		quantity: '100',
		unit: 'g',
		receivedOn: addDays(today, -5),
		expiresOn: addDays(today, 365),
		...fields
	});
	if (!checked.ok) throw new Error(JSON.stringify(checked.fieldErrors));
	const lot = receiveLot(lead, checked.value, [pdfUpload()]);
	if (status === 'released')
		decideLot(lead, lot.id, 'released', '', String(fields.receivedOn ?? addDays(today, -5)));
	return lot;
}

/**
 * A release or rejection with its signature row, written without the password check so fixtures
 * stay synchronous (the signing itself is tested in lot-signing.test.ts).
 */
export function decideLot(
	person: { id: string; email: string },
	lotId: string,
	to: LotDecision,
	reason: string,
	asOf = today
) {
	db.transaction((tx) => {
		insertSignature(
			{
				signerId: person.id,
				signerEmail: person.email,
				signerName: person.email,
				meaning: LOT_SIGNATURE_MEANINGS[to],
				subjectType: 'lot',
				subjectId: lotId,
				subjectDigest: lotDigest(findLot(lotId, tx)!, tx),
				comment: reason
			},
			tx
		);
		applyLotStatus(tx, person, lotId, to, reason, asOf);
	});
}

type Line = {
	componentId: string;
	amount: number;
	unit: string;
	shelfFormId?: string;
	tolerancePercent?: number;
};

/** An approved recipe with these lines, written by one scientist and approved by an engineer. */
export async function makeApprovedRecipe(
	lines: Line[],
	fields: Partial<DraftFieldsInput> = {},
	stocks: { stockRecipeId: string; amount: number }[] = [],
	kind: 'basal' | 'stock_solution' = 'basal'
) {
	counter++;
	const author = await makeUser(['media_scientist']);
	const approver = await makeUser(['engineer']);
	const recipeId = createRecipe(author, {
		name: `Test medium ${counter} ${crypto.randomUUID().slice(0, 4)}`,
		kind
	});
	const version = findVersion(recipeId, 1)!;
	const draft = {
		fields: {
			targetPh: '',
			osmolalityMinMOsmPerKg: '',
			osmolalityMaxMOsmPerKg: '',
			preparationTemperatureC: '25',
			shelfLifeDays: '',
			storage: '',
			instructions: '',
			changeNote: 'First issue.',
			...fields
		},
		lines: [
			...lines.map((l) => ({
				...blankLine('component'),
				componentId: l.componentId,
				shelfFormId: l.shelfFormId ?? '',
				amount: String(l.amount),
				unit: l.unit,
				tolerancePercent: String(l.tolerancePercent ?? 2)
			})),
			...stocks.map((s) => ({
				...blankLine('stock'),
				stockRecipeId: s.stockRecipeId,
				amount: String(s.amount)
			}))
		]
	};
	const checked = checkDraft(draft, recipeId);
	if (!checked.ok) throw new Error(JSON.stringify(checked.fieldErrors));
	const revision = saveDraft(author, version.id, version.revision, checked.value);
	submitForReview(author, version.id, revision);
	await signVersion({ ...approver, roles: rolesOf(approver.id) as Role[] }, version.id, {
		password: approver.password,
		meaning: 'approved',
		comment: ''
	});
	return { recipeId, versionId: version.id };
}
