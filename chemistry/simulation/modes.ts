import type { FeedPlan, SimulationPlan } from './validate';

/** Integration runs segment by segment, so every jump in flows or state falls on a segment edge. */
export interface Segment {
	startH: number;
	endH: number;
	flow: 'closed' | 'fed' | 'continuous';
	/** what happens at `startH` before integrating */
	entry: 'none' | 'feedStart' | 'continuousStart' | 'draw' | 'cycleStart';
	/** with entry 'feedStart': the fed-batch streams (request indices) that start at `startH` */
	startingFeeds: readonly number[];
}

const NO_FEEDS: readonly number[] = [];

export function planSegments(plan: SimulationPlan): Segment[] {
	const { mode, startH, endH } = plan;
	const segments: Segment[] = [];
	// Jumps closer than this are one (a segment that short would be all rounding).
	const eps = 1e-9 * Math.max(1, endH);
	const push = (fromH: number, toH: number, flow: Segment['flow'], entry: Segment['entry']) =>
		segments.push({ startH: fromH, endH: toH, flow, entry, startingFeeds: NO_FEEDS });
	const pushLead = () => {
		if (startH > 0) push(0, startH, 'closed', 'none');
	};
	switch (mode) {
		case 'batch':
			push(0, endH, 'closed', 'none');
			break;
		case 'fedBatch': {
			pushLead();
			const starts = groupFeedStarts(plan.feeds!, eps);
			starts.forEach((group, k) => {
				const toH = k + 1 < starts.length ? starts[k + 1].startH : endH;
				segments.push({
					startH: group.startH,
					endH: toH,
					flow: 'fed',
					entry: 'feedStart',
					startingFeeds: group.feeds
				});
			});
			break;
		}
		case 'chemostat':
		case 'perfusion':
			pushLead();
			push(startH, endH, 'continuous', 'continuousStart');
			break;
		case 'drawFill': {
			const everyH = plan.drawFill!.everyH;
			pushLead();
			// Draws exactly at endH are left out: the run is over.
			let from = startH;
			let entry: Segment['entry'] = 'cycleStart';
			for (let k = 1; ; k++) {
				const drawH = startH + k * everyH;
				if (drawH >= endH - eps) break;
				push(from, drawH, 'closed', entry);
				from = drawH;
				entry = 'draw';
			}
			push(from, endH, 'closed', entry);
			break;
		}
	}
	return segments;
}

/** The streams' start times in order, streams starting together (within `eps`) in one group. */
function groupFeedStarts(
	feeds: readonly FeedPlan[],
	eps: number
): { startH: number; feeds: number[] }[] {
	const order = feeds.map((_, i) => i).sort((a, b) => feeds[a].startH - feeds[b].startH);
	const groups: { startH: number; feeds: number[] }[] = [];
	for (const i of order) {
		const last = groups.at(-1);
		if (last !== undefined && feeds[i].startH - last.startH <= eps) last.feeds.push(i);
		else groups.push({ startH: feeds[i].startH, feeds: [i] });
	}
	return groups;
}
