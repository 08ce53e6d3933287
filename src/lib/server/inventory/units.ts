import { BASE_UNIT, type QuantityKind } from '$lib/inventory';
import {
	convertMass,
	convertVolume,
	isMassUnit,
	readQuantityUnit,
	storedMass,
	storedVolumeUl
} from '$lib/quantities';
import type { Component } from '../db/schema';
import { RuleError } from '../rule-error';

const UNITS_ACCEPTED = 'kg, g, mg, L, mL or µL';

/**
 * A quantity as received, converted to the lot's integer base unit (mg or µL). Only the documented
 * units are read (readQuantityUnit): "lb" or "gal" is refused, not converted. A volume is accepted
 * only for a component with a density, since batches weigh by mass.
 */
export function toBaseQuantity(
	amount: number,
	unitText: string,
	component: Pick<Component, 'name' | 'densityGPerMl'>,
	fields = { amount: 'amount', unit: 'unit' }
): { kind: QuantityKind; quantity: number } {
	if (!Number.isFinite(amount) || amount <= 0)
		throw new RuleError('The quantity must be a number above zero.', { field: fields.amount });
	const unit = readQuantityUnit(unitText);
	if (!unit || unit === 'µg')
		throw new RuleError(
			`“${unitText.trim().slice(0, 20)}” is not a unit of mass or volume kept here: use ${UNITS_ACCEPTED}.`,
			{ field: fields.unit }
		);
	const kind: QuantityKind = isMassUnit(unit) ? 'mass' : 'volume';
	if (kind === 'volume' && !component.densityGPerMl) {
		throw new RuleError(
			`${component.name} has no density in the component library, so it is kept by mass: give the quantity in g or kg (or set its density first).`,
			{ field: fields.unit }
		);
	}
	const quantity = Math.round(
		isMassUnit(unit) ? convertMass(amount, unit, 'mg') : convertVolume(amount, unit, 'µL')
	);
	if (quantity < 1)
		throw new RuleError(`The quantity is below 1 ${BASE_UNIT[kind]}, the smallest amount kept.`, {
			field: fields.amount
		});
	if (quantity > Number.MAX_SAFE_INTEGER / 1000)
		throw new RuleError('The quantity is too large to keep.', { field: fields.amount });
	return { kind, quantity };
}

/** The base-unit quantity of a lot that holds `massG` grams of its material. */
export function massToLotQuantity(
	massG: number,
	lot: { quantityKind: QuantityKind },
	component: Pick<Component, 'name' | 'densityGPerMl'>
): number {
	if (lot.quantityKind === 'mass') return storedMass(massG, 'g', 'mg');
	if (!component.densityGPerMl)
		throw new RuleError(
			`${component.name} is kept by volume but has no density to convert a mass.`
		);
	return storedVolumeUl(massG / component.densityGPerMl, 'mL');
}

/** Grams held by a quantity of a lot, for reorder levels set in grams. */
export function lotQuantityToGrams(
	quantity: number,
	kind: QuantityKind,
	densityGPerMl: number | null
): number | null {
	if (kind === 'mass') return convertMass(quantity, 'mg', 'g');
	return densityGPerMl ? convertVolume(quantity, 'µL', 'mL') * densityGPerMl : null;
}
