// The site's decimal mark: the point until set, then the comma, audited; the readers follow it, and a
// lot received as text (the form, the API and CSV share the lot reader) is read by it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedReferenceLibrary } from '$lib/server/components/reference-library';
import { setSiteDecimalMark, siteDecimalMark } from '$lib/number-reading';
import { allAuditEvents } from '$lib/server/audit';
import { checkLotInput } from '$lib/server/inventory/lot-input';
import { RuleError } from '$lib/server/rule-error';
import {
	applySiteDecimalMark,
	setStoredDecimalMark,
	storedDecimalMark
} from '$lib/server/site-decimal-mark';
import { isoToday } from '$lib/inventory';
import { addDays } from '$lib/server/inventory/alerts';

const admin = { id: null, email: 'admin@lab.test' };
const today = isoToday();
const lotText = (quantity: string) => ({
	component: 'sodium-chloride',
	supplier: 'Calder Lab Supply',
	supplierLot: `DM-${quantity}`,
	quantity,
	unit: 'g',
	receivedOn: today,
	expiresOn: addDays(today, 300)
});

beforeAll(() => seedReferenceLibrary());
afterAll(() => setSiteDecimalMark('point'));

describe('the site decimal mark', () => {
	it('is the point until set, then the comma, audited, and the readers follow it', () => {
		expect(storedDecimalMark()).toBe('point');
		expect(applySiteDecimalMark()).toBe('point');
		const atPoint = checkLotInput(lotText('1,5'));
		expect(!atPoint.ok && atPoint.fieldErrors.quantity[0]).toMatch(/decimal comma/);

		setStoredDecimalMark(admin, ' comma ');
		expect(storedDecimalMark()).toBe('comma');
		expect(siteDecimalMark()).toBe('comma');
		const [entry] = allAuditEvents({ action: 'settings.decimal_mark' });
		expect(entry.detail).toEqual({ from: 'point', to: 'comma' });
		const atComma = checkLotInput(lotText('1,5'));
		expect(atComma.ok && atComma.value.receivedQuantity).toBe(1_500);
		const ambiguous = checkLotInput(lotText('1.500'));
		expect(!ambiguous.ok && ambiguous.fieldErrors.quantity[0]).toMatch(/is ambiguous/);

		setStoredDecimalMark(admin, 'point');
		expect(siteDecimalMark()).toBe('point');
	});

	it('refuses anything but the two marks, naming the field', () => {
		let refusal: unknown;
		try {
			setStoredDecimalMark(admin, 'apostrophe');
		} catch (cause) {
			refusal = cause;
		}
		expect(refusal).toBeInstanceOf(RuleError);
		expect(refusal).toMatchObject({ field: 'decimalMark' });
		expect((refusal as Error).message).toBe('Decimal mark: choose Point (1.5) or Comma (1,5).');
	});
});
