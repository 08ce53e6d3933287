import { ChemistryInputError, computeMassToWeigh, type MassToWeighResult } from '$chemistry';
import type { Component } from '../db/schema';
import { RuleError } from '../rule-error';

export interface ScalableComponentLine {
	amount: number;
	unit: string;
	/** The component the amount is expressed as (the basis form). */
	component: Pick<Component, 'name' | 'formula' | 'molarMassGPerMol'>;
	/** The form weighed, when it differs (MgSO4 given, MgSO4·7H2O weighed). */
	shelfForm?: Pick<Component, 'name' | 'formula' | 'molarMassGPerMol'> | null;
}

export interface LotFactors {
	assayPercent: number | null;
	waterContentPercent: number | null;
}

/**
 * The mass of the shelf form to weigh for one line of a batch: target × volume, converted to the
 * form on the shelf (hydrate factor) and to the chosen lot (assay, water content).
 */
export function scaleComponentLine(
	line: ScalableComponentLine,
	volumeL: number,
	lot: LotFactors | null,
	field = 'line'
): MassToWeighResult {
	const shelf = line.shelfForm ?? line.component;
	try {
		return computeMassToWeigh({
			target: { amount: line.amount, unit: line.unit },
			volumeL,
			basis: line.shelfForm
				? {
						formula: line.component.formula,
						molarMassGPerMol: line.component.formula ? null : line.component.molarMassGPerMol
					}
				: null,
			shelfForm: {
				formula: shelf.formula,
				molarMassGPerMol: shelf.formula ? null : shelf.molarMassGPerMol,
				assayPercent: lot?.assayPercent ?? null,
				waterContentPercent: lot?.waterContentPercent ?? null
			}
		});
	} catch (cause) {
		if (cause instanceof ChemistryInputError)
			throw new RuleError(`${shelf.name}: ${cause.message}`, { field });
		throw cause;
	}
}

/** A stock line is dosed in mL of stock per litre of medium. */
export function scaleStockLine(
	doseMlPerL: number,
	volumeL: number
): { volumeMl: number; steps: string[] } {
	const volumeMl = doseMlPerL * volumeL;
	return {
		volumeMl,
		steps: [
			`${doseMlPerL} mL/L × ${Number(volumeL.toPrecision(6))} L = ${Number(volumeMl.toPrecision(6))} mL of stock`
		]
	};
}
