// Checks on each accepted step: a state that is not finite, or below zero beyond rounding, is a failed run.
import { SimulationFailedError } from './errors';
import { P, S, STATE_COUNT, V, X } from './model';

/** A concentration or volume below −this (in its own unit) is a failed integration, not rounding. */
export const NEGATIVE_STATE_TOLERANCE = 1e-6;

const STATE_NAMES = ['biomass', 'substrate', 'product', 'volume', 'dissolved oxygen'];

export function checkFinite(y: number[], tH: number): void {
	for (let i = 0; i < STATE_COUNT; i++) {
		if (!Number.isFinite(y[i])) {
			throw new SimulationFailedError(
				`The integration produced a non-finite ${STATE_NAMES[i]} at t = ${tH.toFixed(3)} h.`,
				'nonFinite',
				tH
			);
		}
	}
}

/** Checked only on a step that ends the stretch nowhere earlier: a step past a regime change (S below 0 at exhaustion) is cut back to it. */
export function checkNonNegative(y: number[], tH: number): void {
	for (const i of [X, S, P, V]) {
		if (y[i] < -NEGATIVE_STATE_TOLERANCE) {
			throw new SimulationFailedError(
				`The integration drove ${STATE_NAMES[i]} to ${y[i].toExponential(2)} at t = ${tH.toFixed(3)} h, below zero beyond the tolerance.`,
				'negativeState',
				tH
			);
		}
	}
}
