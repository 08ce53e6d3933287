// The events a run watches for: substrate exhaustion, O2 limitation, the maximum volume and washout.
import { formatNumber, type ThresholdEvent } from './events';
import {
	C,
	computeExhaustionThresholdGPerL,
	O2_MOLAR_MASS_G_PER_MOL,
	OXYGEN_LIMITED_FRACTION_OF_SATURATION,
	S,
	V,
	X
} from './model';
import type { SimulationPlan } from './validate';

/** The run's trackers; `washout` is armed, with its reference biomass, when continuous operation starts. */
export function createTrackers(plan: SimulationPlan): {
	trackers: ThresholdEvent[];
	washout: ThresholdEvent | null;
} {
	const p = plan.parameters;
	const trackers: ThresholdEvent[] = [];
	let washout: ThresholdEvent | null = null;
	const sEx = computeExhaustionThresholdGPerL(p.ksGPerL);
	trackers.push({
		kind: 'substrateExhausted',
		measure: (y) => y[S],
		threshold: sEx,
		direction: 'falling',
		rearmAbove: 10 * sEx,
		stops: false,
		armed: true,
		count: 0,
		describe: () => `Substrate exhausted: S fell below ${formatNumber(sEx)} g/L.`
	});
	const o2 = p.oxygen;
	if (o2 !== null) {
		const limit = OXYGEN_LIMITED_FRACTION_OF_SATURATION * o2.saturationMgPerL;
		const maxOtr = (o2.kLaPerH * o2.saturationMgPerL) / O2_MOLAR_MASS_G_PER_MOL;
		trackers.push({
			kind: 'oxygenLimited',
			measure: (y) => y[C],
			threshold: limit,
			direction: 'falling',
			rearmAbove: 2 * limit,
			stops: false,
			armed: true,
			count: 0,
			describe: () =>
				`Oxygen-limited: DO fell below ${formatNumber(limit)} mg/L (5 % of saturation); transfer is at its maximum, about ${formatNumber(maxOtr)} mmol/L/h.`
		});
	}
	if (plan.maxVolumeL !== null && plan.mode === 'fedBatch') {
		const maxVolumeL = plan.maxVolumeL;
		trackers.push({
			kind: 'maxVolumeReached',
			measure: (y) => y[V],
			threshold: maxVolumeL,
			direction: 'rising',
			rearmAbove: null,
			stops: true,
			armed: true,
			count: 0,
			describe: () =>
				`Maximum working volume (${formatNumber(maxVolumeL)} L) reached; the run stops here.`
		});
	}
	if (plan.mode === 'chemostat' || plan.mode === 'perfusion' || plan.mode === 'drawFill') {
		// Armed, with its reference biomass, when continuous operation or the first cycle starts.
		washout = {
			kind: 'washout',
			measure: (y) => y[X],
			threshold: 0,
			direction: 'falling',
			rearmAbove: null,
			stops: false,
			armed: false,
			count: 0,
			describe: () => ''
		};
		trackers.push(washout);
	}
	return { trackers, washout };
}
