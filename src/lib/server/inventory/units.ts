import { unit as mathUnit } from 'mathjs';
import { BASE_UNIT, type QuantityKind } from '$lib/inventory';
import { convertMass, convertVolume, storedMass, storedVolumeUl } from '$lib/quantities';
import type { Component } from '../db/schema';
import { RuleError } from '../rule-error';

const MASS = mathUnit(1, 'g');

/** "µL" as mathjs spells it. */
function mathUnitName(text: string): string {
	return text.trim().replace(/^[µμ]/, 'u');
}

/**
 * A quantity as received, converted through mathjs to the lot's integer base unit (mg or µL).
 * A volume is accepted only for a component with a density, since batches weigh by mass.
 */
export function toBaseQuantity(
	amount: number,
	unitText: string,
	component: Pick<Component, 'name' | 'densityGPerMl'>,
	fields = { amount: 'amount', unit: 'unit' }
): { kind: QuantityKind; quantity: number } {
	if (!Number.isFinite(amount) || amount <= 0)
		throw new RuleError('The quantity must be a number above zero.', { field: fields.amount });
	let parsed;
	try {
		parsed = mathUnit(amount, mathUnitName(unitText));
	} catch {
		throw new RuleError(
			`“${unitText}” is not a unit of mass or volume: use kg, g, mg, L, mL or µL.`,
			{ field: fields.unit }
		);
	}
	const kind: QuantityKind | null = parsed.equalBase(MASS)
		? 'mass'
		: parsed.equalBase(mathUnit(1, 'L'))
			? 'volume'
			: null;
	if (!kind)
		throw new RuleError(
			`“${unitText}” is not a unit of mass or volume: use kg, g, mg, L, mL or µL.`,
			{ field: fields.unit }
		);
	if (kind === 'volume' && !component.densityGPerMl) {
		throw new RuleError(
			`${component.name} has no density in the component library, so it is kept by mass: give the quantity in g or kg (or set its density first).`,
			{ field: fields.unit }
		);
	}
	const quantity = Math.round(parsed.toNumber(kind === 'mass' ? 'mg' : 'uL'));
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
