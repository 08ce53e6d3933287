import { readDecimalText } from '$lib/number-reading';
import { and, eq, sql } from 'drizzle-orm';
import { DATE_KINDS, isoToday, type DateKind, type QuantityKind } from '$lib/inventory';
import { MAX_ASSAY_PERCENT } from '$chemistry';
import { findComponentByIdOrName } from '../components/library';
import { db, type Db } from '../db';
import { lot, type Component } from '../db/schema';
import type { FieldErrors } from '../forms';
import { RuleError } from '../rule-error';
import { toBaseQuantity } from './units';

type Reader = Pick<Db, 'select'>;

/** A lot as typed on the form, in a CSV row or in the API: text fields, checked by `checkLotInput`. */
export const LOT_FIELDS = [
	'component',
	'supplier',
	'supplierLot',
	'quantity',
	'unit',
	'receivedOn',
	'expiresOn',
	'dateKind',
	'storage',
	'assayPercent',
	'purityPercent',
	'waterContentPercent',
	'note'
] as const;
export type LotField = (typeof LOT_FIELDS)[number];
export type LotText = Partial<Record<LotField, string | number | null | undefined>>;

export interface CheckedLot {
	componentId: string;
	componentName: string;
	supplier: string;
	supplierLot: string;
	quantityKind: QuantityKind;
	receivedQuantity: number;
	receivedUnit: string;
	receivedOn: string;
	expiresOn: string;
	dateKind: DateKind;
	storage: string;
	assayPercent: number | null;
	purityPercent: number | null;
	waterContentPercent: number | null;
	note: string;
}

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

function text(value: unknown): string {
	return value === null || value === undefined ? '' : String(value).trim();
}

function checkDate(
	value: string,
	field: string,
	label: string,
	errors: FieldErrors
): string | null {
	if (!value) {
		errors[field] = [`Enter the ${label} (YYYY-MM-DD).`];
		return null;
	}
	const date = new Date(`${value}T00:00:00Z`);
	if (
		!ISO_DATE.test(value) ||
		Number.isNaN(date.getTime()) ||
		date.toISOString().slice(0, 10) !== value
	) {
		errors[field] = [`“${value}” is not a date; write it as YYYY-MM-DD.`];
		return null;
	}
	return value;
}

function checkPercent(
	value: string,
	field: string,
	label: string,
	min: number,
	max: number,
	minOpen: boolean,
	maxOpen: boolean,
	errors: FieldErrors
): number | null {
	if (!value) return null;
	const read = readDecimalText(value.replace(/\s*%$/, ''), label);
	if (!read.ok) {
		errors[field] = [read.message];
		return null;
	}
	const n = read.value;
	const tooLow = minOpen ? n <= min : n < min;
	const tooHigh = maxOpen ? n >= max : n > max;
	if (tooLow || tooHigh) {
		errors[field] = [
			`${label} must be a number ${minOpen ? 'above' : 'from'} ${min} ${maxOpen ? 'and below' : 'up to'} ${max} %.`
		];
		return null;
	}
	return n;
}

/** Case and spacing do not make a different supplier or supplier lot. */
export function findDuplicateLot(
	componentId: string,
	supplier: string,
	supplierLot: string,
	reader: Reader = db
) {
	return reader
		.select({ id: lot.id, code: lot.code })
		.from(lot)
		.where(
			and(
				eq(lot.componentId, componentId),
				sql`lower(trim(${lot.supplier})) = lower(${supplier.trim()})`,
				sql`lower(trim(${lot.supplierLot})) = lower(${supplierLot.trim()})`
			)
		)
		.get();
}

/** The quantity received, in the lot's base unit (mg or µL) when the component is known. */
function checkLotQuantity(
	input: LotText,
	component: Component | undefined,
	errors: FieldErrors
): {
	quantityText: string;
	unit: string;
	quantity: { kind: QuantityKind; quantity: number } | null;
} {
	const quantityText = text(input.quantity);
	const quantityRead = readDecimalText(quantityText, 'Quantity');
	let quantity: { kind: QuantityKind; quantity: number } | null = null;
	const unit = text(input.unit) || 'g';
	if (!quantityText) errors.quantity = ['Enter the quantity received.'];
	else if (!quantityRead.ok) errors.quantity = [quantityRead.message];
	else if (component) {
		try {
			quantity = toBaseQuantity(quantityRead.value, unit, component, {
				amount: 'quantity',
				unit: 'unit'
			});
		} catch (cause) {
			if (!(cause instanceof RuleError)) throw cause;
			errors[cause.field ?? 'quantity'] = [cause.message];
		}
	}
	return { quantityText, unit, quantity };
}

/** Received (not in the future), expiry or retest (after receipt), and which of the two it is. */
function checkLotDates(
	input: LotText,
	today: string,
	errors: FieldErrors
): { receivedOn: string | null; expiresOn: string | null; dateKindText: string } {
	const receivedOn = checkDate(text(input.receivedOn), 'receivedOn', 'date received', errors);
	if (receivedOn && receivedOn > today)
		errors.receivedOn = [`${receivedOn} is in the future; a lot is recorded when it arrives.`];
	const expiresOn = checkDate(text(input.expiresOn), 'expiresOn', 'expiry or retest date', errors);
	if (receivedOn && expiresOn && expiresOn <= receivedOn) {
		errors.expiresOn = [
			`The expiry or retest date (${expiresOn}) must be after the date received (${receivedOn}).`
		];
	}
	const dateKindText = text(input.dateKind) || 'expiry';
	if (!(DATE_KINDS as readonly string[]).includes(dateKindText))
		errors.dateKind = ['Choose expiry or retest.'];
	return { receivedOn, expiresOn, dateKindText };
}

/** Assay and purity (required) and water content (optional) from the certificate. */
function checkLotPercents(input: LotText, errors: FieldErrors) {
	const assayPercent = checkPercent(
		text(input.assayPercent),
		'assayPercent',
		'Assay',
		0,
		MAX_ASSAY_PERCENT,
		true,
		false,
		errors
	);
	const purityPercent = checkPercent(
		text(input.purityPercent),
		'purityPercent',
		'Purity',
		0,
		100,
		true,
		false,
		errors
	);
	const waterContentPercent = checkPercent(
		text(input.waterContentPercent),
		'waterContentPercent',
		'Water content',
		0,
		100,
		false,
		true,
		errors
	);

	return { assayPercent, purityPercent, waterContentPercent };
}

/** Checks every field and reports each problem against its field; nothing is written here. */
export function checkLotInput(
	input: LotText,
	reader: Reader = db,
	today = isoToday()
): { ok: true; value: CheckedLot } | { ok: false; fieldErrors: FieldErrors } {
	const errors: FieldErrors = {};
	const componentText = text(input.component);
	const component = componentText ? findComponentByIdOrName(componentText, reader) : undefined;
	if (!componentText) errors.component = ['Choose the component this lot is of.'];
	else if (!component) errors.component = [`No component “${componentText}” in the library.`];

	const supplier = text(input.supplier);
	if (!supplier) errors.supplier = ['Enter the supplier.'];
	else if (supplier.length > 120) errors.supplier = ['At most 120 characters.'];
	const supplierLot = text(input.supplierLot);
	if (!supplierLot)
		errors.supplierLot = ['Enter the supplier’s lot number from the label or certificate.'];
	else if (supplierLot.length > 80) errors.supplierLot = ['At most 80 characters.'];

	const { quantityText, unit, quantity } = checkLotQuantity(input, component, errors);
	const { receivedOn, expiresOn, dateKindText } = checkLotDates(input, today, errors);
	const { assayPercent, purityPercent, waterContentPercent } = checkLotPercents(input, errors);

	const storage = text(input.storage) || component?.storage || '';
	if (storage.length > 200) errors.storage = ['At most 200 characters.'];
	const note = text(input.note);
	if (note.length > 1000) errors.note = ['At most 1000 characters.'];

	if (component && supplier && supplierLot && !errors.supplierLot) {
		const duplicate = findDuplicateLot(component.id, supplier, supplierLot, reader);
		if (duplicate)
			errors.supplierLot = [
				`${supplier} lot ${supplierLot} of ${component.name} is already received, as ${duplicate.code}.`
			];
	}

	if (Object.keys(errors).length || !component || !quantity || !receivedOn || !expiresOn) {
		return { ok: false, fieldErrors: errors };
	}
	return {
		ok: true,
		value: {
			componentId: component.id,
			componentName: component.name,
			supplier,
			supplierLot,
			quantityKind: quantity.kind,
			receivedQuantity: quantity.quantity,
			receivedUnit: `${quantityText} ${unit}`,
			receivedOn,
			expiresOn,
			dateKind: dateKindText as DateKind,
			storage,
			assayPercent,
			purityPercent,
			waterContentPercent,
			note
		}
	};
}
