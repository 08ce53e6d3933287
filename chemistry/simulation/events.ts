import type { SimulationEventKind } from './types';

/**
 * A threshold crossing of a quantity measured on the (effective) state. A falling event re-arms
 * once the quantity has risen back above `rearmAbove` (hysteresis, so a state hovering at the
 * threshold reports once, not at every step).
 */
export interface ThresholdEvent {
	kind: SimulationEventKind;
	measure: (y: ArrayLike<number>) => number;
	threshold: number;
	direction: 'falling' | 'rising';
	/** null: reported once per run */
	rearmAbove: number | null;
	/** the run ends at the crossing */
	stops: boolean;
	armed: boolean;
	/** how many times it has been reported */
	count: number;
	describe: () => string;
}

/** Reports of one kind beyond this many are dropped (a draw-fill run can exhaust every cycle). */
export const MAX_REPORTS_PER_KIND = 200;

export function hasCrossed(event: ThresholdEvent, value: number): boolean {
	return event.direction === 'falling' ? value < event.threshold : value >= event.threshold;
}

/** Re-arms a falling event whose quantity has recovered. */
export function updateArming(event: ThresholdEvent, value: number): void {
	if (!event.armed && event.rearmAbove !== null && value > event.rearmAbove) event.armed = true;
}

/**
 * Locates the zero of g (here a measured quantity minus its threshold along the dense-output
 * interpolant) inside [tA, tB], given opposite signs at the ends, by the Illinois variant of regula
 * falsi (Dowell & Jarratt 1971). Returns the bracket's side before the crossing, so a state stopped
 * there has not yet crossed, or with `side` 'after' the side past it, where the crossed condition
 * already holds (a regime entered there is not left again at once).
 */
export function locateCrossing(
	g: (tH: number) => number,
	tA: number,
	gA: number,
	tB: number,
	gB: number,
	side: 'before' | 'after' = 'before'
): number {
	let a = tA;
	let b = tB;
	let fa = gA;
	let fb = gB;
	let lastMoved = 0;
	const tolerance = 1e-11 * Math.max(1, Math.abs(tB));
	for (let iteration = 0; iteration < 200 && b - a > tolerance; iteration++) {
		let c = b - (fb * (b - a)) / (fb - fa);
		if (!(c > a && c < b)) c = 0.5 * (a + b);
		const fc = g(c);
		if (fc === 0 && side === 'before') return c;
		// With 'after', g ≤ 0 is not yet crossed (a regime switch needs g > 0).
		if (side === 'after' ? fc <= 0 : fc * fa > 0) {
			a = c;
			fa = fc;
			if (lastMoved === -1) fb *= 0.5;
			lastMoved = -1;
		} else {
			b = c;
			fb = fc;
			if (lastMoved === 1) fa *= 0.5;
			lastMoved = 1;
		}
	}
	return side === 'before' ? a : b;
}

/** Numbers in event messages: three significant digits, no trailing zeros. */
export function formatNumber(value: number): string {
	return Number(value.toPrecision(3)).toString();
}
