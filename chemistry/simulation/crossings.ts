// Where in an integrator step (xOld, x] a stopping event or a change of regime happened.
import { hasCrossed, locateCrossing, type ThresholdEvent } from './events';

/** Why an integration stretch ended before its end time. */
export type Cut =
	| { kind: 'stop'; tH: number; event: ThresholdEvent }
	| { kind: 'switch'; tH: number; apply: (tH: number) => void };

/**
 * A change of regime that ends a stretch where `value` (on the effective state) turns from ≤ 0 to
 * positive; `apply` then changes the regime (and the state it holds) at the located time.
 */
export interface RegimeSwitch {
	value: (tH: number, state: ArrayLike<number>) => number;
	apply: (tH: number) => void;
}

/** The earliest stopping event that crossed its threshold in the step, located on the dense output. */
export function findStop(
	trackers: ThresholdEvent[],
	previous: number[],
	current: number[],
	at: (tH: number) => ArrayLike<number>,
	xOld: number,
	x: number
): Cut | null {
	let cut: Cut | null = null;
	for (let i = 0; i < trackers.length; i++) {
		const event = trackers[i];
		if (!event.stops || !event.armed) continue;
		if (!hasCrossed(event, current[i]) || hasCrossed(event, previous[i])) continue;
		const g = (tH: number) => event.measure(at(tH)) - event.threshold;
		const tH = locateCrossing(
			g,
			xOld,
			previous[i] - event.threshold,
			x,
			current[i] - event.threshold
		);
		if (cut === null || tH < cut.tH) cut = { kind: 'stop', tH, event };
	}
	return cut;
}

/**
 * The earliest change of regime whose value turned positive in the step (located just after its
 * crossing); updates `previousValues` to the values at x.
 */
export function findRegimeSwitch(
	switches: RegimeSwitch[],
	previousValues: number[],
	state: ArrayLike<number>,
	at: (tH: number) => ArrayLike<number>,
	xOld: number,
	x: number
): Cut | null {
	let cut: Cut | null = null;
	for (let i = 0; i < switches.length; i++) {
		const change = switches[i];
		const now = change.value(x, state);
		if (now > 0 && previousValues[i] <= 0) {
			const g = (t: number) => change.value(t, at(t));
			const tH = locateCrossing(g, xOld, previousValues[i], x, now, 'after');
			if (cut === null || tH < cut.tH) cut = { kind: 'switch', tH, apply: change.apply };
		}
		previousValues[i] = now;
	}
	return cut;
}
