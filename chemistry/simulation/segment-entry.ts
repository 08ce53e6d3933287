// What happens at a segment's start (a feed starting, continuous operation, a draw) and its flows.
import { formatNumber, type ThresholdEvent } from './events';
import type { FeedStreams } from './feed-streams';
import { applyDrawFill } from './feeding';
import { V, WASHOUT_FRACTION, X, type FlowPhase } from './model';
import type { Segment } from './modes';
import type { SimulationEvent } from './types';
import type { SimulationPlan } from './validate';

/** What entering a segment reads and changes: the state `y` and `events` are the run's own. */
export interface SegmentEntryContext {
	plan: SimulationPlan;
	y: number[];
	events: SimulationEvent[];
	feedStreams: FeedStreams | null;
	washout: ThresholdEvent | null;
}

/** Applies what happens at a segment's start and returns its flows. */
export function enterSegment(segment: Segment, run: SegmentEntryContext): FlowPhase {
	const { plan, y, events } = run;
	switch (segment.entry) {
		case 'feedStart':
			events.push(
				...run.feedStreams!.start(segment.startingFeeds, segment.startH, y, plan.maxVolumeL)
			);
			break;
		case 'continuousStart':
			armWashout(run);
			if (segment.startH > 0) {
				events.push({
					kind: 'feedStarted',
					tH: segment.startH,
					message: `Continuous operation started at D = ${formatNumber(plan.continuous!.dilutionPerH)} /h.`
				});
			}
			break;
		case 'cycleStart':
			armWashout(run);
			break;
		case 'draw': {
			const { fraction } = plan.drawFill!;
			const saturation = plan.parameters.oxygen?.saturationMgPerL ?? null;
			applyDrawFill(y, fraction, plan.feedSubstrateGPerL, saturation);
			events.push({
				kind: 'draw',
				tH: segment.startH,
				message: `Drew ${formatNumber(100 * fraction)} % (${formatNumber(fraction * y[V])} L) and refilled with fresh medium.`
			});
			break;
		}
	}
	if (segment.flow === 'closed') return { kind: 'closed' };
	if (segment.flow === 'continuous') {
		return {
			kind: 'continuous',
			...plan.continuous!,
			feedSubstrateGPerL: plan.feedSubstrateGPerL
		};
	}
	return run.feedStreams!.phase();
}

/** Arms washout against the biomass at continuous operation's or the first cycle's start. */
function armWashout({ washout, y, plan }: SegmentEntryContext): void {
	if (washout === null) return;
	const reference = y[X];
	washout.threshold = WASHOUT_FRACTION * reference;
	washout.armed = true;
	const began = plan.mode === 'drawFill' ? 'the draw cycles began' : 'continuous operation began';
	washout.describe = () =>
		`Washout: biomass fell below 1 % of the ${formatNumber(reference)} g/L it had when ${began}.`;
}
