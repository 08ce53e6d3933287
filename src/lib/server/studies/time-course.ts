import { ChemistryInputError, SimulationFailedError, simulateRun, type FeedInput, type SimulationRequest } from '$chemistry';
import type { DefaultUsed, StudyInputs, TimeCourse } from './types';

const OUTPUT_POINTS = 200;

interface PlanRun {
	inputs: StudyInputs;
	feeds: { volumeL: number; composition: { componentsGPerL: Record<string, number> } }[];
	growth: { carbonSourceId: string; yieldXSGPerG: number; muMaxPerH: number; ksGPerL: number };
	yieldXO2GPerG: number;
	kLaPerH: number;
	saturationMgPerL: number;
	initialBiomassGPerL: number;
	targetBiomassGPerL: number;
	reachesFraction: number;
	defaults: DefaultUsed[];
}

/**
 * The feeding plan as a simulation feed: every feed follows the plan's shape, so their sum is one
 * stream carrying their volume-weighted carbon source, and the rates deliver exactly the planned
 * volume between the feed start and the end of the run.
 */
function buildFeed(run: PlanRun, feedL: number): FeedInput | undefined {
	const { plan } = run.inputs;
	if (feedL <= 0) return undefined;
	const carbonG = run.feeds.reduce((sum, f) => sum + f.volumeL * (f.composition.componentsGPerL[run.growth.carbonSourceId] ?? 0), 0);
	// The model needs some substrate in the feed; a feed without carbon is modelled as nearly none.
	const substrateGPerL = Math.max(carbonG / feedL, 1e-9);
	const spanH = plan.durationH - plan.feedStartH;
	if (spanH <= 0) throw new ChemistryInputError(`The feed starts at ${plan.feedStartH} h, not before the end of the run at ${plan.durationH} h.`, { field: 'feedStartH' });
	switch (plan.feedStrategy) {
		case 'constant':
			return { strategy: 'constant', substrateGPerL, startH: plan.feedStartH, rateLPerH: feedL / spanH };
		case 'linear':
			return { strategy: 'linear', substrateGPerL, startH: plan.feedStartH, rateLPerH: 0, slopeLPerH2: (2 * feedL) / spanH ** 2 };
		case 'exponential': {
			const mu = plan.feedMuSetPerH;
			if (mu === null || !(mu > 0)) throw new ChemistryInputError('An exponential feeding plan needs its growth rate μset above 0.', { field: 'feedMuSetPerH' });
			const f0 = (feedL * mu) / Math.expm1(mu * spanH);
			return { strategy: 'expression', substrateGPerL, startH: plan.feedStartH, expression: `${f0} * exp(${mu} * (t - ${plan.feedStartH}))` };
		}
	}
}

/** Simulates the study's run; a plan the model cannot run answers with the reason instead. */
export function simulatePlan(run: PlanRun): TimeCourse | { message: string } {
	const { plan, profile, basal, vessel } = run.inputs;
	const feedL = run.feeds.reduce((sum, f) => sum + f.volumeL, 0);
	try {
		const feed = buildFeed(run, feedL);
		const request: SimulationRequest = {
			mode: feed ? 'fedBatch' : 'batch',
			kinetics: {
				muMaxPerH: run.growth.muMaxPerH,
				ksGPerL: run.growth.ksGPerL,
				yieldXS: run.growth.yieldXSGPerG,
				maintenanceGPerGH: profile.maintenanceGPerGH ?? 0,
				yieldXO2: run.yieldXO2GPerG
			},
			initial: {
				biomassGPerL: run.initialBiomassGPerL,
				substrateGPerL: basal.composition.componentsGPerL[run.growth.carbonSourceId] ?? 0,
				volumeL: plan.initialVolumeL
			},
			...(feed ? { feed } : {}),
			oxygen: { kLaPerH: run.kLaPerH, saturationMgPerL: run.saturationMgPerL },
			maxVolumeL: vessel.maxWorkingVolumeL,
			endH: plan.durationH,
			outputEveryH: plan.durationH / OUTPUT_POINTS
		};
		const result = simulateRun(request);
		const last = result.biomassGPerL.length - 1;
		const finalBiomassGPerL = result.biomassGPerL[last];
		run.defaults.push({
			what: 'Time course model',
			value: 'Monod growth, Pirt maintenance, no O2 limitation of growth, O2 maintenance 0',
			source: 'Growth is not slowed by low DO in the model, so a DO that reaches 0 shows the oxygen shortfall'
		});
		return {
			t: result.t,
			biomassGPerL: result.biomassGPerL,
			substrateGPerL: result.substrateGPerL,
			volumeL: result.volumeL,
			dissolvedOxygenMgPerL: result.dissolvedOxygenMgPerL ?? [],
			ourMmolPerLH: result.ourMmolPerLH ?? [],
			maxOtrMmolPerLH: result.maxOtrMmolPerLH ?? [],
			events: result.events,
			finalBiomassGPerL,
			reachesTarget: result.biomassGPerL.some((x) => x >= run.targetBiomassGPerL * run.reachesFraction),
			stoppedAtH: result.stoppedAtH ?? null
		};
	} catch (cause) {
		if (cause instanceof ChemistryInputError || cause instanceof SimulationFailedError) return { message: cause.message };
		throw cause;
	}
}
