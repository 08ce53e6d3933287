import type { SimulationPlan } from './validate';

/** Integration runs segment by segment, so every jump in flows or state falls on a segment edge. */
export interface Segment {
	startH: number;
	endH: number;
	flow: 'closed' | 'fed' | 'continuous';
	/** what happens at `startH` before integrating */
	entry: 'none' | 'feedStart' | 'continuousStart' | 'draw' | 'cycleStart';
}

export function planSegments(plan: SimulationPlan): Segment[] {
	const { mode, startH, endH } = plan;
	const segments: Segment[] = [];
	const pushLead = () => {
		if (startH > 0) segments.push({ startH: 0, endH: startH, flow: 'closed', entry: 'none' });
	};
	switch (mode) {
		case 'batch':
			segments.push({ startH: 0, endH, flow: 'closed', entry: 'none' });
			break;
		case 'fedBatch':
			pushLead();
			segments.push({ startH, endH, flow: 'fed', entry: 'feedStart' });
			break;
		case 'chemostat':
		case 'perfusion':
			pushLead();
			segments.push({ startH, endH, flow: 'continuous', entry: 'continuousStart' });
			break;
		case 'drawFill': {
			const everyH = plan.drawFill!.everyH;
			pushLead();
			// Draws exactly at endH are left out: the run is over.
			const eps = 1e-9 * Math.max(1, endH);
			let from = startH;
			let entry: Segment['entry'] = 'cycleStart';
			for (let k = 1; ; k++) {
				const drawH = startH + k * everyH;
				if (drawH >= endH - eps) break;
				segments.push({ startH: from, endH: drawH, flow: 'closed', entry });
				from = drawH;
				entry = 'draw';
			}
			segments.push({ startH: from, endH, flow: 'closed', entry });
			break;
		}
	}
	return segments;
}
