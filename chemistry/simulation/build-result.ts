// The run's result from its output series, events, regime intervals and integrator counts.
import type { FeedStreams } from './feed-streams';
import { ABSOLUTE_TOLERANCE, O2_MOLAR_MASS_G_PER_MOL, RELATIVE_TOLERANCE, V } from './model';
import { truncateOutput, type Output } from './output';
import type { RegimeControl } from './regime-control';
import type { SimulationEvent, SimulationResult } from './types';
import type { SimulationPlan } from './validate';

export interface FinishedRun {
	plan: SimulationPlan;
	/** the final state, delivered volumes included */
	y: number[];
	out: Output;
	events: SimulationEvent[];
	regimes: RegimeControl;
	feedStreams: FeedStreams | null;
	stats: { accepted: number; rejected: number; evaluations: number };
	stoppedAtH: number | null;
}

export function buildSimulationResult(run: FinishedRun): SimulationResult {
	const { plan, out: o, regimes } = run;
	const p = plan.parameters;
	truncateOutput(o);
	const o2 = p.oxygen;
	const maxOtr = o2 === null ? 0 : (o2.kLaPerH * o2.saturationMgPerL) / O2_MOLAR_MASS_G_PER_MOL;
	const result: SimulationResult = {
		t: o.t,
		biomassGPerL: o.x,
		substrateGPerL: o.s,
		productGPerL: o.p,
		volumeL: o.v,
		dissolvedOxygenMgPerL: o2 === null ? null : o.c,
		feedLPerH: o.feed,
		feedStreams:
			run.feedStreams?.results(
				run.y,
				plan.initialState[V],
				o.streamFeeds.length > 0 ? o.streamFeeds : [null]
			) ?? null,
		ourMmolPerLH: o2 === null && p.demandYieldXO2 === null ? null : o.our,
		maxOtrMmolPerLH: o2 === null ? null : maxOtr,
		events: run.events.slice().sort((a, b) => a.tH - b.tH),
		tolerances: { absolute: ABSOLUTE_TOLERANCE, relative: RELATIVE_TOLERANCE },
		quasiSteadyOxygenH: o2 === null ? null : regimes.quasiSteadyIntervals,
		oxygenLimitedH: o2 === null ? null : regimes.oxygenLimitedIntervals,
		integratorSteps: { ...run.stats }
	};
	if (run.stoppedAtH !== null) result.stoppedAtH = run.stoppedAtH;
	return result;
}
