import { ChemistryInputError } from '../errors';
import {
	SimulationFailedError,
	simulateRun,
	type FeedInput,
	type SimulationRequest,
	type SimulationResult
} from '../simulation';
import { StudyDataError } from './errors';
import type { DefaultUsed, StudyFeedSource, StudyInputs, TimeCourse } from './types';
import { isControlledPlan } from './vocabulary';

const OUTPUT_POINTS = 200;

export interface PlanRun {
	inputs: StudyInputs;
	/** The study's feeds, volumes already scaled by the what-if. */
	feeds: StudyFeedSource[];
	growth: { carbonSourceId: string; yieldXSGPerG: number; muMaxPerH: number; ksGPerL: number };
	yieldXO2GPerG: number;
	kLaPerH: number;
	saturationMgPerL: number;
	/** C* of air at the run's temperature and pressure: DO setpoints are % of it. */
	airSaturationMgPerL: number;
	initialBiomassGPerL: number;
	targetBiomassGPerL: number;
	reachesFraction: number;
	defaults: DefaultUsed[];
}

/** What each feed delivered in the simulated run, aligned with `PlanRun.feeds`. */
export interface FeedDelivery {
	deliveredL: number;
	/** Volume delivered by each output time, L. */
	cumulativeL: number[];
}

export type PlanCourse = TimeCourse & { deliveries: FeedDelivery[] };

/**
 * The study's two runs. `demand`: the plan as written, growth never held back by oxygen (DO is still
 * followed, so a DO-stat feed reads it), whose OUR is what the vessel must supply. `vessel`: the same
 * plan in this vessel, growth held to what transfer supplies wherever DO reaches 0.
 */
export interface PlanCourses {
	demand: PlanCourse | { message: string };
	vessel: PlanCourse | { message: string };
}

export const isControlled = (feed: StudyFeedSource) => isControlledPlan(feed.plan.strategy);

/**
 * One feed as a simulation stream. Open plans deliver exactly their planned volume between their
 * start and the end of the run; controlled plans (substrate- or DO-stat) run as the culture asks,
 * up to the pump's top rate.
 */
function toStream(run: PlanRun, feed: StudyFeedSource): FeedInput {
	const { plan } = feed;
	const { durationH } = run.inputs.plan;
	const substrateGPerL = feed.composition.componentsGPerL[run.growth.carbonSourceId] ?? 0;
	const spanH = durationH - plan.startH;
	const common = { label: feed.label, substrateGPerL, startH: plan.startH };
	switch (plan.strategy) {
		case 'constant':
			return { ...common, strategy: 'constant', rateLPerH: feed.volumeL / spanH };
		case 'linear':
			return {
				...common,
				strategy: 'linear',
				rateLPerH: 0,
				slopeLPerH2: (2 * feed.volumeL) / spanH ** 2
			};
		case 'exponential': {
			const mu = plan.muSetPerH!;
			// F(t) = F0·e^{μ(t − t0)} with F0 chosen so that ∫ F dt over the span is the planned volume.
			const f0 = (feed.volumeL * mu) / Math.expm1(mu * spanH);
			return {
				...common,
				strategy: 'expression',
				expression: `${f0} * exp(${mu} * (t - ${plan.startH}))`
			};
		}
		case 'substrateStat': {
			const slot = run.feeds.indexOf(feed) + 1;
			const carbon =
				run.inputs.componentNames[run.growth.carbonSourceId] ?? run.growth.carbonSourceId;
			const initialGPerL =
				run.inputs.basal.composition.componentsGPerL[run.growth.carbonSourceId] ?? 0;
			if (substrateGPerL <= plan.setpointGPerL! || substrateGPerL <= initialGPerL) {
				const what =
					substrateGPerL === 0
						? `carries no ${carbon}`
						: `carries ${substrateGPerL.toPrecision(3)} g/L ${carbon}, not more than ${substrateGPerL <= plan.setpointGPerL! ? `the setpoint of ${plan.setpointGPerL} g/L` : `the basal medium's ${initialGPerL.toPrecision(3)} g/L`}`;
				throw new StudyDataError(
					`${feed.label} ${what}, so a substrate-stat plan cannot hold ${carbon} at its setpoint with it. Choose another plan for this feed, or a feed that carries more ${carbon}.`,
					{
						field: `feed${slot}Strategy`
					}
				);
			}
			return {
				...common,
				strategy: 'substrateStat',
				setpointGPerL: plan.setpointGPerL!,
				maxRateLPerH: plan.maxRateLPerH!
			};
		}
		case 'doStat':
			return {
				...common,
				strategy: 'doStat',
				doSetpointMgPerL: (plan.doSetpointPercent! / 100) * run.airSaturationMgPerL,
				maxRateLPerH: plan.maxRateLPerH!
			};
	}
}

const STREAM_FIELD_TO_SLOT: Record<string, string> = {
	startH: 'StartH',
	setpointGPerL: 'SetpointGPerL',
	doSetpointMgPerL: 'DoSetpointPercent',
	maxRateLPerH: 'MaxRateLPerH',
	muSetPerH: 'MuSetPerH',
	substrateGPerL: 'Strategy',
	strategy: 'Strategy'
};

/** A stream's field `feeds.N.x` as the study form's field of that feed. */
function studyFieldOf(
	field: string | undefined,
	streamFeeds: StudyFeedSource[],
	feeds: StudyFeedSource[]
): string | undefined {
	const m = /^feeds\.(\d+)\.(\w+)/.exec(field ?? '');
	if (!m) return field;
	const slot = feeds.indexOf(streamFeeds[Number(m[1])]) + 1;
	return `feed${slot}${STREAM_FIELD_TO_SLOT[m[2]] ?? 'Strategy'}`;
}

/**
 * Cumulative integral of a rate series by the trapezoid rule, rescaled to the exact total. The rate
 * jumps from 0 at the stream's start, so the step that holds the start counts only from it.
 */
function cumulative(t: number[], rate: number[], startH: number, totalL: number): number[] {
	const out = new Array<number>(t.length).fill(0);
	for (let i = 1; i < t.length; i++) {
		const step =
			t[i - 1] < startH
				? rate[i] * Math.max(0, t[i] - startH)
				: 0.5 * (rate[i] + rate[i - 1]) * (t[i] - t[i - 1]);
		out[i] = out[i - 1] + step;
	}
	const last = out[out.length - 1];
	return last > 0 ? out.map((v) => (v * totalL) / last) : out;
}

/** When a rising series first reaches `level`, interpolated between output points; null if it never does. */
export function findCrossingH(t: number[], values: number[], level: number): number | null {
	const i = values.findIndex((v) => v >= level);
	if (i < 0) return null;
	if (i === 0) return t[0];
	return t[i - 1] + ((t[i] - t[i - 1]) * (level - values[i - 1])) / (values[i] - values[i - 1]);
}

/** The run's series as the report keeps them, with each feed's delivery. */
function toCourse(
	run: PlanRun,
	result: SimulationResult,
	streamFeeds: StudyFeedSource[]
): PlanCourse {
	const last = result.biomassGPerL.length - 1;
	const streams = result.feedStreams ?? [];
	const deliveries = run.feeds.map((f) => {
		const k = streamFeeds.indexOf(f);
		if (k < 0) return { deliveredL: 0, cumulativeL: new Array<number>(result.t.length).fill(0) };
		return {
			deliveredL: streams[k].deliveredL,
			cumulativeL: cumulative(
				result.t,
				streams[k].feedLPerH ?? result.feedLPerH,
				f.plan.startH,
				streams[k].deliveredL
			)
		};
	});
	return {
		t: result.t,
		biomassGPerL: result.biomassGPerL,
		substrateGPerL: result.substrateGPerL,
		volumeL: result.volumeL,
		dissolvedOxygenMgPerL: result.dissolvedOxygenMgPerL ?? [],
		ourMmolPerLH: result.ourMmolPerLH ?? [],
		maxOtrMmolPerLH: result.maxOtrMmolPerLH,
		oxygenLimitedH: result.oxygenLimitedH ?? [],
		events: result.events,
		finalBiomassGPerL: result.biomassGPerL[last],
		reachesTarget: result.biomassGPerL.some(
			(x) => x >= run.targetBiomassGPerL * run.reachesFraction
		),
		targetReachedAtH: findCrossingH(result.t, result.biomassGPerL, run.targetBiomassGPerL),
		stoppedAtH: result.stoppedAtH ?? null,
		deliveries
	};
}

/**
 * Simulates the study's plan twice (see `PlanCourses`). A plan the model cannot run answers with the
 * reason instead, unless a controlled feed's volume depends on it: then the study cannot be assessed
 * and the error names the field.
 */
export function simulatePlan(run: PlanRun): PlanCourses {
	const { plan, profile, basal, vessel } = run.inputs;
	const streamFeeds = run.feeds.filter((f) => f.volumeL > 0);
	const request: SimulationRequest = {
		mode: streamFeeds.length > 0 ? 'fedBatch' : 'batch',
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
		...(streamFeeds.length > 0 ? { feeds: streamFeeds.map((f) => toStream(run, f)) } : {}),
		oxygen: { kLaPerH: run.kLaPerH, saturationMgPerL: run.saturationMgPerL },
		maxVolumeL: vessel.maxWorkingVolumeL,
		endH: plan.durationH,
		outputEveryH: plan.durationH / OUTPUT_POINTS
	};
	const attempt = (limitsGrowth: boolean): PlanCourse | { message: string } => {
		try {
			return toCourse(
				run,
				simulateRun({ ...request, oxygen: { ...request.oxygen!, limitsGrowth } }),
				streamFeeds
			);
		} catch (cause) {
			if (!(cause instanceof ChemistryInputError || cause instanceof SimulationFailedError))
				throw cause;
			if (streamFeeds.some(isControlled)) {
				const field =
					cause instanceof ChemistryInputError
						? studyFieldOf(cause.field, streamFeeds, run.feeds)
						: undefined;
				throw new StudyDataError(
					`A substrate- or DO-stat feed delivers what the simulated run asks for, and the run cannot be simulated: ${cause.message}`,
					{ field }
				);
			}
			return { message: cause.message };
		}
	};
	const demand = attempt(false);
	const carbon = run.inputs.componentNames[run.growth.carbonSourceId] ?? run.growth.carbonSourceId;
	run.defaults.push({
		what: 'Time course model',
		value: `Monod growth on ${carbon}, Pirt maintenance to exhaustion, O2 maintenance 0; DO falls with uptake and, at 0, holds growth to what transfer supplies (OTR = OUR); biomass then held to what the required nutrients have supplied by each time, at their demand per g of biomass (never below the inoculum)`,
		source:
			'The model help of the simulation; the law of the minimum (Sprengel 1828, von Liebig 1840) for the other required nutrients. Where a nutrient holds growth, the substrate, DO and OUR shown are those of growth on the carbon source alone (drawn grey from there)'
	});
	run.defaults.push({
		what: 'Oxygen and heat figures',
		value: 'from the O2 demand of the plan as written, up to the target density',
		source:
			'A second run of the same plan whose growth oxygen never holds back: the growth the feeds would support, and the O2 the vessel must supply for it'
	});
	// Where DO never reached 0 in the demand run, oxygen held nothing back: the vessel run would be the
	// same run again, to the last number.
	const transferKeptUp = !('message' in demand) && demand.oxygenLimitedH.length === 0;
	return { demand, vessel: transferKeptUp ? demand : attempt(true) };
}
