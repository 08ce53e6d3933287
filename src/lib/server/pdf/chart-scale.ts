/** An axis from 0: where it ends and where its labelled ticks go. */
export interface AxisTicks {
	endValue: number;
	step: number;
	ticks: number[];
}

const NICE_MULTIPLES = [1, 2, 2.5, 5, 10];

/** A step of 1, 2, 2.5 or 5 × 10ⁿ that cuts `span` into at most about `count` parts. */
function niceStep(span: number, count: number): number {
	const raw = span / count;
	const magnitude = 10 ** Math.floor(Math.log10(raw));
	return NICE_MULTIPLES.map((m) => m * magnitude).find((s) => s >= raw * (1 - 1e-9))!;
}

function ticksUpTo(endValue: number, step: number): number[] {
	const count = Math.floor(endValue / step + 1e-9);
	return Array.from({ length: count + 1 }, (_, i) => i * step);
}

/** Room above the highest value, so that a line at the maximum does not run along the plot's top. */
const HEADROOM = 1.04;

/** A value axis from 0 to the first nice tick above `maxValue` (to 1 when there is nothing). */
export function valueAxis(maxValue: number, count = 5): AxisTicks {
	const top = Number.isFinite(maxValue) && maxValue > 0 ? maxValue * HEADROOM : 1;
	const step = niceStep(top, count);
	const endValue = Math.ceil(top / step - 1e-9) * step;
	return { endValue, step, ticks: ticksUpTo(endValue, step) };
}

/**
 * A time axis that ends exactly at the run's end, not at the next round number: nice ticks inside
 * it, and the end itself labelled when it is not too close to the last of them.
 */
export function timeAxis(runEndH: number, count = 6): AxisTicks {
	const endH = Number.isFinite(runEndH) && runEndH > 0 ? runEndH : 1;
	const step = niceStep(endH, count);
	const ticks = ticksUpTo(endH, step);
	if (endH - ticks[ticks.length - 1] >= 0.5 * step) ticks.push(endH);
	return { endValue: endH, step, ticks };
}

/** A tick label with no more decimals than it needs (0, 2.5, 5, 7.5; a run's end at 42.5). */
export function formatTick(value: number, step: number): string {
	const decimals = Math.min(6, Math.max(3, -Math.floor(Math.log10(step)) + 1));
	return String(Number(value.toFixed(decimals)));
}
