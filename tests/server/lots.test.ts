import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { config } from '$lib/server/config';
import { db } from '$lib/server/db';
import { component, lot, lotCertificate } from '$lib/server/db/schema';
import { addDays } from '$lib/server/inventory/alerts';
import {
	checkCertificateFile,
	cleanDisplayName,
	contentDisposition,
	MAX_CERTIFICATE_BYTES
} from '$lib/server/inventory/certificates';
import { importLotCsv, previewLotCsv } from '$lib/server/inventory/csv';
import { checkLotInput } from '$lib/server/inventory/lot-input';
import { signLotDecision } from '$lib/server/inventory/lot-signing';
import { listLots } from '$lib/server/inventory/lot-list';
import { findLot, receiveLot } from '$lib/server/inventory/lots';
import { RuleError } from '$lib/server/rule-error';
import { makeLead, makeLot, PDF_BYTES, pdfUpload, today } from './inventory-fixtures';

let lead: Awaited<ReturnType<typeof makeLead>>;
beforeAll(async () => {
	seedReferenceLibrary();
	lead = await makeLead();
});

const base = {
	component: 'sodium-chloride',
	supplier: 'Northfield Reagents',
	supplierLot: 'NR-1',
	quantity: '5',
	unit: 'kg',
	receivedOn: addDays(today, -1),
	expiresOn: addDays(today, 300)
};

function storedFiles(): string[] {
	const folder = join(config.uploadsFolder, 'certificates');
	return existsSync(folder) ? readdirSync(folder) : [];
}

describe('receiving a lot', () => {
	it('converts the quantity to integer base units', () => {
		const checked = checkLotInput({ ...base, quantity: '2.5', unit: 'kg' });
		expect(checked.ok && checked.value.receivedQuantity).toBe(2_500_000);
		expect(checked.ok && checked.value.quantityKind).toBe('mass');
	});

	it('refuses a volume for a powder with no density, and accepts it for a liquid with one', () => {
		const powder = checkLotInput({ ...base, quantity: '500', unit: 'mL' });
		expect(powder.ok).toBe(false);
		expect(!powder.ok && powder.fieldErrors.unit[0]).toMatch(
			/has no density in the component library, so it is kept by mass/
		);
		db.update(component).set({ densityGPerMl: 1.261 }).where(eq(component.id, 'glycerol')).run();
		const liquid = checkLotInput({ ...base, component: 'glycerol', quantity: '1.5', unit: 'L' });
		expect(liquid.ok && liquid.value).toMatchObject({
			quantityKind: 'volume',
			receivedQuantity: 1_500_000
		});
	});

	it('refuses an expiry before receipt, a date in the future, and a wrong unit', () => {
		const checked = checkLotInput({ ...base, expiresOn: addDays(today, -3), unit: 'furlong' });
		expect(!checked.ok && checked.fieldErrors.expiresOn[0]).toMatch(
			/must be after the date received/
		);
		expect(!checked.ok && checked.fieldErrors.unit[0]).toMatch(/not a unit of mass or volume/);
		const future = checkLotInput({
			...base,
			receivedOn: addDays(today, 2),
			expiresOn: addDays(today, 20)
		});
		expect(!future.ok && future.fieldErrors.receivedOn[0]).toMatch(/in the future/);
	});

	it('refuses a duplicate supplier lot for the same supplier and component, whatever the case, and writes nothing', () => {
		const first = makeLot(lead.actor, { supplierLot: 'DUP-77' });
		const lotsBefore = db.select().from(lot).all().length;
		const again = checkLotInput({
			...base,
			supplier: ' northfield reagents ',
			supplierLot: 'dup-77'
		});
		expect(!again.ok && again.fieldErrors.supplierLot[0]).toBe(
			`northfield reagents lot dup-77 of Sodium chloride is already received, as ${first.code}.`
		);
		const otherComponent = checkLotInput({
			...base,
			component: 'potassium-chloride',
			supplierLot: 'DUP-77'
		});
		expect(otherComponent.ok).toBe(true);
		expect(db.select().from(lot).all().length).toBe(lotsBefore);
	});

	it('stores certificates under random names and removes them when the transaction fails', () => {
		const filesBefore = storedFiles().length;
		const checked = checkLotInput({ ...base, supplierLot: 'RACE-1' });
		if (!checked.ok) throw new Error('fixture');
		receiveLot(lead.actor, checked.value, [pdfUpload('../../etc/passwd.pdf')]);
		expect(storedFiles().length).toBe(filesBefore + 1);
		for (const name of storedFiles()) expect(name).toMatch(/^[0-9a-f]{36}\.(pdf|png|jpg)$/);
		// The same checked value again: the unique index refuses it inside the transaction.
		expect(() => receiveLot(lead.actor, checked.value, [pdfUpload()])).toThrow(RuleError);
		expect(storedFiles().length).toBe(filesBefore + 1);
	});
});

describe('certificate uploads', () => {
	const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]);

	it('judges the type from the bytes: HTML behind a .pdf name is refused, a PNG named .pdf is stored as PNG', async () => {
		await expect(
			checkCertificateFile(
				new File(['<html><script>alert(1)</script>'], 'coa.pdf', { type: 'application/pdf' })
			)
		).rejects.toThrow(
			'“coa.pdf” is not a PDF, PNG or JPEG file (judged from its contents, not its name); it was not stored.'
		);
		const checked = await checkCertificateFile(
			new File([png], 'scan.pdf', { type: 'application/pdf' })
		);
		expect(checked.mediaType).toBe('image/png');
		expect(checked.displayName).toBe('scan.pdf.png');
		expect((await checkCertificateFile(new File([PDF_BYTES], 'coa.pdf'))).mediaType).toBe(
			'application/pdf'
		);
		expect(
			(
				await checkCertificateFile(
					new File([new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 1])], 'photo.jpeg')
				)
			).mediaType
		).toBe('image/jpeg');
	});

	it('refuses a file over 10 MB and an empty one', async () => {
		const big = new Uint8Array(MAX_CERTIFICATE_BYTES + 1);
		big.set(PDF_BYTES);
		await expect(checkCertificateFile(new File([big], 'big.pdf'))).rejects.toThrow(
			/is 10\.0 MB; certificates may be up to 10 MB/
		);
		await expect(checkCertificateFile(new File([], 'empty.pdf'))).rejects.toThrow(
			'“empty.pdf” is empty.'
		);
	});

	it('keeps a path-traversal name only as a cleaned display name, never a path', () => {
		expect(cleanDisplayName('../../etc/passwd', 'pdf')).toBe('passwd.pdf');
		expect(cleanDisplayName('..\\..\\boot.ini', 'pdf')).toBe('boot.ini.pdf');
		expect(cleanDisplayName('"evil"\r\nX-Header: 1.pdf', 'pdf')).toBe('evil X-Header 1.pdf');
		expect(contentDisposition('Zertifikat ä "1".pdf')).toBe(
			`attachment; filename="Zertifikat _ _1_.pdf"; filename*=UTF-8''Zertifikat%20%C3%A4%20%221%22.pdf`
		);
	});
});

describe('release and rejection', () => {
	it('releases only with a certificate on file and an in-date lot; rejection needs a reason', async () => {
		const checker = await makeLead();
		const sign = (lotId: string, decision: string, reason = '') =>
			signLotDecision(checker, lotId, { decision, reason, password: checker.password });
		const checked = checkLotInput({ ...base, supplierLot: 'NOCERT-1' });
		if (!checked.ok) throw new Error('fixture');
		const bare = receiveLot(lead.actor, checked.value, []);
		await expect(sign(bare.id, 'released')).rejects.toThrow(/no certificate of analysis on file/);
		const expired = makeLot(lead.actor, {
			status: 'quarantine',
			receivedOn: addDays(today, -40),
			expiresOn: addDays(today, -1)
		});
		await expect(sign(expired.id, 'released')).rejects.toThrow(/passed its expiry date/);
		await expect(sign(expired.id, 'rejected', '  ')).rejects.toThrow(
			'Reason: give the reason for rejecting the lot'
		);
		await sign(expired.id, 'rejected', 'Expired on arrival');
		expect(findLot(expired.id)?.status).toBe('rejected');
		await expect(sign(expired.id, 'released')).rejects.toThrow(
			/is rejected; it cannot be released now/
		);
		expect(listLots({ status: 'rejected' }).map((l) => l.id)).toContain(expired.id);
	});
});

describe('CSV import', () => {
	const header = 'component,supplier,supplier_lot,quantity,unit,received_on,expires_on';

	it('reads quantities by the one number rule and only the documented units, naming the file’s columns', () => {
		const csv = [
			header,
			`sodium-chloride,Calder Lab Supply,CSV-7,"1,500",g,${today},${addDays(today, 100)}`,
			`sodium-chloride,Calder Lab Supply,CSV-8,2,lb,${today},${addDays(today, 100)}`,
			`sodium-chloride,Calder Lab Supply,CSV-9,"1,5",kg,${today},${addDays(today, 100)}`,
			`sodium-chloride,Calder Lab Supply,CSV-10,1500,g,${today},${addDays(today, 100)}`
		].join('\n');
		const preview = previewLotCsv(csv);
		expect(preview.rows[0].errors).toEqual([
			'quantity: Quantity: “1,500” is ambiguous: it could be 1.5 or 1500. This site writes decimals with a point and no thousands separator: type 1500 or 1.5.'
		]);
		expect(preview.rows[1].errors).toEqual([
			'unit: “lb” is not a unit of mass or volume kept here: use kg, g, mg, L, mL or µL.'
		]);
		expect(preview.rows[2].errors.join(' ')).toMatch(/^quantity: .*decimal comma/);
		expect(preview.rows[3].errors).toEqual([]);
		expect(preview.rows[3].value?.receivedQuantity).toBe(1_500_000);
	});

	it('previews every row with its problems and imports nothing while one row is wrong', () => {
		const csv = [
			header,
			`sodium-chloride,Calder Lab Supply,CSV-1,1,kg,${today},${addDays(today, 100)}`,
			`sodium-chloride,Calder Lab Supply,CSV-2,1,mL,${today},${addDays(today, -1)}`,
			`sodium-chloride,Calder Lab Supply,csv-1,1,kg,${today},${addDays(today, 100)}`
		].join('\n');
		const preview = previewLotCsv(csv);
		expect(preview.valid).toBe(1);
		expect(preview.rows[1].errors.join(' ')).toMatch(/unit: .*no density/);
		expect(preview.rows[1].errors.join(' ')).toMatch(/expires_on: .*must be after/);
		expect(preview.rows[2].errors).toEqual([
			'supplier_lot: the same supplier lot is on row 2 of this file.'
		]);
		const before = db.select().from(lot).all().length;
		expect(() => importLotCsv(lead.actor, csv)).toThrow(
			'2 of 3 rows have problems; nothing was imported. Correct them and preview again.'
		);
		expect(db.select().from(lot).all().length).toBe(before);
		const good = [
			header,
			`sodium-chloride,Calder Lab Supply,CSV-1,1,kg,${today},${addDays(today, 100)}`,
			`d-glucose,Calder Lab Supply,CSV-3,500,g,${today},${addDays(today, 100)}`
		].join('\n');
		expect(importLotCsv(lead.actor, good)).toBe(2);
		expect(db.select().from(lotCertificate).all().length).toBeGreaterThan(0);
	});
});
