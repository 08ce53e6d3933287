import { createHash } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { PDFDocument, StandardFonts } from 'pdf-lib';
import { addDays } from '../inventory/alerts';
import { db } from '../db';
import { batch, component, recipe } from '../db/schema';
import { createBatch } from '../batches/create';
import { completeBatch } from '../batches/completion';
import { recordLine } from '../batches/line-record';
import { chooseLot } from '../batches/lot-choice';
import { recordMeasurements } from '../batches/measurements';
import { reviewBatch } from '../batches/review';
import { buildSheetLines } from '../batches/sheet';
import { checkLotInput, findDuplicateLot } from '../inventory/lot-input';
import { signLotDecision } from '../inventory/lot-signing';
import { receiveLot } from '../inventory/lots';
import { sniffMediaType, type CheckedUpload } from '../inventory/certificates';
import { findUserByEmail, rolesOf } from '../people';
import { currentApprovedVersion } from '../recipes/queries';
import { isoToday } from '$lib/inventory';
import { convertVolume } from '$lib/quantities';
import { DEMO_PASSWORD } from './accounts';

/*
 * Invented suppliers and lots of Pilot Plant North. Dates are set relative to the day the demo is
 * seeded, so there is always an expired lot, one expiring soon, one in quarantine and one low on stock.
 */
type DemoLot = {
	component: string;
	supplier: string;
	supplierLot: string;
	quantity: string;
	unit: string;
	receivedDaysAgo: number;
	expiresInDays: number;
	dateKind?: 'expiry' | 'retest';
	assayPercent?: string;
	waterContentPercent?: string;
	purityPercent?: string;
	/** released (default), quarantine, or rejected with a reason */
	status?: 'released' | 'quarantine' | { rejected: string };
};

export const DEMO_LOTS: DemoLot[] = [
	{
		component: 'sodium-chloride',
		supplier: 'Northfield Reagents',
		supplierLot: 'NR-24-0931',
		quantity: '5',
		unit: 'kg',
		receivedDaysAgo: 120,
		expiresInDays: 900,
		assayPercent: '99.7',
		waterContentPercent: '0.1'
	},
	{
		component: 'sodium-chloride',
		supplier: 'Harrowgate Fine Chemicals',
		supplierLot: 'HF-5521-B',
		quantity: '1',
		unit: 'kg',
		receivedDaysAgo: 30,
		expiresInDays: 1200,
		assayPercent: '99.9'
	},
	{
		component: 'dipotassium-hydrogen-phosphate',
		supplier: 'Northfield Reagents',
		supplierLot: 'NR-24-1107',
		quantity: '2.5',
		unit: 'kg',
		receivedDaysAgo: 90,
		expiresInDays: 700,
		assayPercent: '99.1',
		waterContentPercent: '0.4'
	},
	{
		component: 'potassium-dihydrogen-phosphate',
		supplier: 'Northfield Reagents',
		supplierLot: 'NR-24-1108',
		quantity: '2.5',
		unit: 'kg',
		receivedDaysAgo: 90,
		expiresInDays: 700,
		assayPercent: '99.5'
	},
	{
		component: 'ammonium-sulfate',
		supplier: 'Calder Lab Supply',
		supplierLot: 'CLS-77310',
		quantity: '5',
		unit: 'kg',
		receivedDaysAgo: 60,
		expiresInDays: 1000,
		assayPercent: '99.4'
	},
	// Expired: its date passed ten days ago, so it is never offered.
	{
		component: 'd-glucose',
		supplier: 'Brightwater Bioproducts',
		supplierLot: 'BWB-G-2291',
		quantity: '10',
		unit: 'kg',
		receivedDaysAgo: 400,
		expiresInDays: -10,
		assayPercent: '99.6',
		waterContentPercent: '0.2'
	},
	// Expiring within the digest window.
	{
		component: 'd-glucose',
		supplier: 'Brightwater Bioproducts',
		supplierLot: 'BWB-G-2418',
		quantity: '10',
		unit: 'kg',
		receivedDaysAgo: 200,
		expiresInDays: 20,
		assayPercent: '99.8',
		waterContentPercent: '0.1'
	},
	{
		component: 'd-glucose',
		supplier: 'Northfield Reagents',
		supplierLot: 'NR-25-0044',
		quantity: '25',
		unit: 'kg',
		receivedDaysAgo: 15,
		expiresInDays: 700,
		assayPercent: '99.5',
		waterContentPercent: '0.3'
	},
	// Low on stock: below its reorder level (set below).
	{
		component: 'magnesium-sulfate-heptahydrate',
		supplier: 'Harrowgate Fine Chemicals',
		supplierLot: 'HF-3390-M',
		quantity: '60',
		unit: 'g',
		receivedDaysAgo: 300,
		expiresInDays: 250,
		assayPercent: '99.2',
		waterContentPercent: '0.5'
	},
	// In quarantine: received, certificate not yet checked.
	{
		component: 'magnesium-sulfate-heptahydrate',
		supplier: 'Northfield Reagents',
		supplierLot: 'NR-25-0102',
		quantity: '2',
		unit: 'kg',
		receivedDaysAgo: 2,
		expiresInDays: 900,
		assayPercent: '99.6',
		status: 'quarantine'
	},
	// A second one waiting for a second person's release signature.
	{
		component: 'dipotassium-hydrogen-phosphate',
		supplier: 'Calder Lab Supply',
		supplierLot: 'CLS-KP-5127',
		quantity: '1',
		unit: 'kg',
		receivedDaysAgo: 1,
		expiresInDays: 1100,
		assayPercent: '99.1',
		status: 'quarantine'
	},
	{
		component: 'yeast-extract',
		supplier: 'Brightwater Bioproducts',
		supplierLot: 'BWB-YE-118',
		quantity: '2',
		unit: 'kg',
		receivedDaysAgo: 45,
		expiresInDays: 400,
		dateKind: 'retest'
	},
	{
		component: 'soy-peptone',
		supplier: 'Calder Lab Supply',
		supplierLot: 'CLS-SP-4410',
		quantity: '2',
		unit: 'kg',
		receivedDaysAgo: 45,
		expiresInDays: 500
	},
	{
		component: 'soy-peptone',
		supplier: 'Calder Lab Supply',
		supplierLot: 'CLS-SP-3907',
		quantity: '1',
		unit: 'kg',
		receivedDaysAgo: 200,
		expiresInDays: 300,
		status: { rejected: 'Certificate shows a microbial count above the specification.' }
	},
	// A liquid kept by volume (its density is set below).
	{
		component: 'glycerol',
		supplier: 'Harrowgate Fine Chemicals',
		supplierLot: 'HF-GL-7702',
		quantity: '5',
		unit: 'L',
		receivedDaysAgo: 20,
		expiresInDays: 800,
		assayPercent: '99.5',
		waterContentPercent: '0.2'
	},
	// The salts of the trace-element stock, made here as its own batch.
	{
		component: 'trisodium-citrate-dihydrate',
		supplier: 'Kestrel Trace Metals',
		supplierLot: 'KT-TC-2611',
		quantity: '250',
		unit: 'g',
		receivedDaysAgo: 40,
		expiresInDays: 700
	},
	{
		component: 'iron-ii-sulfate-heptahydrate',
		supplier: 'Kestrel Trace Metals',
		supplierLot: 'KT-FE-2611',
		quantity: '100',
		unit: 'g',
		receivedDaysAgo: 40,
		expiresInDays: 700
	},
	{
		component: 'zinc-sulfate-heptahydrate',
		supplier: 'Kestrel Trace Metals',
		supplierLot: 'KT-ZN-2611',
		quantity: '100',
		unit: 'g',
		receivedDaysAgo: 40,
		expiresInDays: 700
	},
	{
		component: 'manganese-ii-sulfate-monohydrate',
		supplier: 'Kestrel Trace Metals',
		supplierLot: 'KT-MN-2611',
		quantity: '100',
		unit: 'g',
		receivedDaysAgo: 40,
		expiresInDays: 700
	},
	{
		component: 'copper-ii-sulfate-pentahydrate',
		supplier: 'Kestrel Trace Metals',
		supplierLot: 'KT-CU-2611',
		quantity: '50',
		unit: 'g',
		receivedDaysAgo: 40,
		expiresInDays: 700
	},
	{
		component: 'cobalt-ii-chloride-hexahydrate',
		supplier: 'Kestrel Trace Metals',
		supplierLot: 'KT-CO-2611',
		quantity: '25',
		unit: 'g',
		receivedDaysAgo: 40,
		expiresInDays: 700
	},
	{
		component: 'sodium-molybdate-dihydrate',
		supplier: 'Kestrel Trace Metals',
		supplierLot: 'KT-MO-2611',
		quantity: '25',
		unit: 'g',
		receivedDaysAgo: 40,
		expiresInDays: 700
	},
	{
		component: 'boric-acid',
		supplier: 'Kestrel Trace Metals',
		supplierLot: 'KT-BO-2611',
		quantity: '100',
		unit: 'g',
		receivedDaysAgo: 40,
		expiresInDays: 700
	},
	{
		component: 'sodium-selenite',
		supplier: 'Kestrel Trace Metals',
		supplierLot: 'KT-SE-2611',
		quantity: '10',
		unit: 'g',
		receivedDaysAgo: 40,
		expiresInDays: 700
	}
];

/** Reorder levels (g) and densities (g/mL) of the demo. Glycerol 1.261 g/mL at 20 °C: CRC Handbook, from memory. */
const STOCK_SETTINGS: Record<string, { reorderLevelG?: number; densityGPerMl?: number }> = {
	'magnesium-sulfate-heptahydrate': { reorderLevelG: 500 },
	'd-glucose': { reorderLevelG: 5000 },
	'sodium-chloride': { reorderLevelG: 1000 },
	glycerol: { reorderLevelG: 2000, densityGPerMl: 1.261 }
};

async function demoCertificate(title: string): Promise<CheckedUpload> {
	const doc = await PDFDocument.create();
	const page = doc.addPage([420, 300]);
	const font = await doc.embedFont(StandardFonts.Helvetica);
	page.drawText('Certificate of analysis (demo, invented)', { x: 30, y: 250, size: 14, font });
	page.drawText(title, { x: 30, y: 220, size: 11, font });
	page.drawText('Issued for the Pilot Plant North demonstration data only.', {
		x: 30,
		y: 190,
		size: 9,
		font
	});
	const bytes = await doc.save();
	const type = sniffMediaType(bytes)!;
	return {
		bytes,
		displayName: `CoA ${title}.pdf`.replace(/[^\w .-]+/g, '-'),
		mediaType: type.mediaType,
		extension: type.extension,
		sizeBytes: bytes.length,
		sha256: createHash('sha256').update(bytes).digest('hex')
	};
}

/** Adds the demo lots that are missing (by supplier lot); returns how many records it added. */
export async function seedDemoInventory(today = isoToday()): Promise<number> {
	const lead = findUserByEmail('inventory@demo.test');
	const stores = findUserByEmail('stores@demo.test');
	if (!lead || !stores) return 0;
	const actor = { id: lead.id, email: lead.email };
	// The second lead checks and signs what the first received, as the site setting asks.
	const signer = { id: stores.id, email: stores.email, roles: rolesOf(stores.id) };
	let added = 0;
	for (const [componentId, settings] of Object.entries(STOCK_SETTINGS)) {
		const row = db.select().from(component).where(eq(component.id, componentId)).get();
		if (!row) continue;
		const set: Partial<typeof component.$inferInsert> = {};
		if (settings.reorderLevelG !== undefined && row.reorderLevelG === null)
			set.reorderLevelG = settings.reorderLevelG;
		if (settings.densityGPerMl !== undefined && row.densityGPerMl === null)
			set.densityGPerMl = settings.densityGPerMl;
		if (Object.keys(set).length)
			db.update(component).set(set).where(eq(component.id, componentId)).run();
	}
	for (const demo of DEMO_LOTS) {
		if (findDuplicateLot(demo.component, demo.supplier, demo.supplierLot)) continue;
		const receivedOn = addDays(today, -demo.receivedDaysAgo);
		const checked = checkLotInput(
			{
				component: demo.component,
				supplier: demo.supplier,
				supplierLot: demo.supplierLot,
				quantity: demo.quantity,
				unit: demo.unit,
				receivedOn,
				expiresOn: addDays(today, demo.expiresInDays),
				dateKind: demo.dateKind ?? 'expiry',
				assayPercent: demo.assayPercent,
				waterContentPercent: demo.waterContentPercent,
				purityPercent: demo.purityPercent
			},
			db,
			today
		);
		if (!checked.ok)
			throw new Error(
				`Demo lot ${demo.supplierLot} is invalid: ${JSON.stringify(checked.fieldErrors)}`
			);
		const certificate = await demoCertificate(`${demo.supplier} ${demo.supplierLot}`);
		const received = receiveLot(actor, checked.value, [certificate]);
		const status = demo.status ?? 'released';
		if (status === 'released') {
			// An expired lot was released while it was in date; release it as of then, then it lapses.
			await signLotDecision(
				signer,
				received.id,
				{
					decision: 'released',
					password: DEMO_PASSWORD,
					reason: 'Certificate checked against the specification.'
				},
				receivedOn
			);
		} else if (typeof status === 'object') {
			await signLotDecision(signer, received.id, {
				decision: 'rejected',
				password: DEMO_PASSWORD,
				reason: status.rejected
			});
		}
		added++;
	}
	added += await seedDemoBatches(today);
	return added;
}

const DEMO_BATCHES: {
	recipe: string;
	volumeL: number;
	intendedUse: string;
	finished: boolean;
	ph?: string;
	osmolality?: string;
}[] = [
	{
		recipe: 'PPN Trace Elements T2',
		volumeL: 0.5,
		intendedUse: 'Trace stock for the pilot runs (demo)',
		finished: true,
		ph: '2.5'
	},
	{
		recipe: 'NB-Min Salts 3',
		volumeL: 2,
		intendedUse: 'Fermenter F2, run 2026-14 (demo)',
		finished: true,
		ph: '7.02',
		osmolality: '262'
	},
	{
		recipe: 'PPN Yeast Extract Broth Y5',
		volumeL: 1,
		intendedUse: 'Seed flasks for run 2026-15 (demo)',
		finished: false
	}
];

/** One batch made, signed and released (so where-used shows something), one planned. */
async function seedDemoBatches(today: string): Promise<number> {
	const technician = findUserByEmail('technician@demo.test');
	const reviewer = findUserByEmail('scientist@demo.test');
	if (!technician || !reviewer) return 0;
	const tech = { id: technician.id, email: technician.email };
	let added = 0;
	for (const demo of DEMO_BATCHES) {
		const recipeRow = db.select().from(recipe).where(eq(recipe.name, demo.recipe)).get();
		const version = recipeRow ? currentApprovedVersion(recipeRow.id) : undefined;
		if (!recipeRow || !version) continue;
		const existing = db
			.select({ id: batch.id })
			.from(batch)
			.where(and(eq(batch.recipeId, recipeRow.id), eq(batch.intendedUse, demo.intendedUse)))
			.get();
		if (existing) continue;
		const planned = createBatch(tech, {
			versionId: version.id,
			recipeId: recipeRow.id,
			targetVolumeMl: convertVolume(demo.volumeL, 'L', 'mL'),
			plannedOn: today,
			intendedUse: demo.intendedUse
		});
		added++;
		if (!demo.finished) continue;
		for (const line of buildSheetLines(planned, db, today)) {
			// Raw lots and the trace stock made above alike: the first-expiring usable one.
			const lotCode = line.suggestion?.code;
			if (!lotCode) throw new Error(`Demo batch: no lot for ${line.name}`);
			chooseLot(tech, planned.id, line.id, lotCode, today);
		}
		for (const line of buildSheetLines(planned, db, today)) {
			recordLine(tech, planned.id, line.id, { actualText: line.requiredText }, today);
		}
		recordMeasurements(tech, planned.id, {
			ph: demo.ph ?? '',
			osmolality: demo.osmolality ?? ''
		});
		await completeBatch(
			tech,
			planned.id,
			{ password: DEMO_PASSWORD, comment: 'Demo batch.' },
			today
		);
		await reviewBatch(
			{ id: reviewer.id, email: reviewer.email, roles: rolesOf(reviewer.id) },
			planned.id,
			{
				decision: 'released',
				password: DEMO_PASSWORD,
				reason: 'Record complete; within tolerance.'
			}
		);
	}
	return added;
}
