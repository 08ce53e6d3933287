// From a request to the plan the integrator follows: the request is checked against its schema
// (request-schema.ts, the one description of its shape and rules), then read without further checks.
import { ChemistryInputError } from '../errors';
import { compileFeedExpression, type FeedExpression } from './expression';
import type { ModelParameters } from './model';
import { fieldOf } from './request-bounds';
import { defaultOutputEveryH, outputTimesH } from './request-rules';
import {
	simulationRequestSchema,
	type FeedInput,
	type OperatingMode,
	type SimulationRequest
} from './request-schema';

export type FeedPlan = {
	/** where the stream sits in the request, for error fields: `feed` or `feeds.N` */
	field: string;
	label: string | null;
	substrateGPerL: number;
	startH: number;
	bolusL: number;
	maxRateLPerH: number;
} & (
	| { strategy: 'constant'; rateLPerH: number }
	| { strategy: 'linear'; rateLPerH: number; slopeLPerH2: number }
	| { strategy: 'exponential'; muSetPerH: number }
	| { strategy: 'substrateStat'; setpointGPerL: number }
	| { strategy: 'doStat'; doSetpointMgPerL: number }
	| { strategy: 'expression'; expression: FeedExpression }
);

export interface SimulationPlan {
	mode: OperatingMode;
	parameters: ModelParameters;
	/** X, S, P, V, C at t = 0 */
	initialState: number[];
	endH: number;
	outputTimesH: number[];
	/** fed-batch feed streams in request order (one for the single `feed`); null in the other modes */
	feeds: FeedPlan[] | null;
	/**
	 * when feeding (fed-batch: the earliest stream), continuous flow (chemostat, perfusion) or draw
	 * cycles begin
	 */
	startH: number;
	/**
	 * substrate of the fresh medium (chemostat, perfusion, draw-fill) or of the single `feed`; 0 in
	 * batch and with `feeds` (fed-batch integration reads each stream's own)
	 */
	feedSubstrateGPerL: number;
	maxVolumeL: number | null;
	continuous: { dilutionPerH: number; cellRemovalPerH: number } | null;
	drawFill: { fraction: number; everyH: number } | null;
}

/**
 * The request checked against its schema. Callers of the science get the first refusal as a
 * `ChemistryInputError` naming its field; the API reports every refusal from the same schema.
 */
export function readSimulationRequest(request: unknown): SimulationRequest {
	if (request === null || typeof request !== 'object') {
		throw new ChemistryInputError('The simulation request must be an object.', {});
	}
	const parsed = simulationRequestSchema.safeParse(request);
	if (parsed.success) return parsed.data;
	const issue = parsed.error.issues[0];
	if (issue.code === 'unrecognized_keys') {
		const field = fieldOf([...issue.path, issue.keys[0]]);
		throw new ChemistryInputError(
			`Unknown field "${issue.keys[0]}": this request has no such field; check its spelling.`,
			{ field }
		);
	}
	const position =
		issue.code === 'custom' ? (issue.params?.position as number | undefined) : undefined;
	return failWith(issue.message, fieldOf(issue.path), position);
}

function failWith(message: string, field: string, position: number | undefined): never {
	throw new ChemistryInputError(message, {
		...(field === '' ? {} : { field }),
		...(position === undefined ? {} : { position })
	});
}

export function validateSimulationRequest(request: unknown): SimulationPlan {
	return planSimulation(readSimulationRequest(request));
}

function modelParameters({ kinetics, oxygen }: SimulationRequest): ModelParameters {
	return {
		muMaxPerH: kinetics.muMaxPerH,
		ksGPerL: kinetics.ksGPerL,
		yieldXS: kinetics.yieldXS,
		maintenanceGPerGH: kinetics.maintenanceGPerGH ?? 0,
		alpha: kinetics.alpha ?? 0,
		beta: kinetics.beta ?? 0,
		oxygen: oxygen
			? {
					kLaPerH: oxygen.kLaPerH,
					saturationMgPerL: oxygen.saturationMgPerL,
					// the schema's rules require Yx/O2 with an oxygen block
					yieldXO2: kinetics.yieldXO2!,
					koMgPerL: kinetics.koMgPerL ?? 0,
					maintenanceMgPerGH: oxygen.maintenanceMgPerGH ?? 0,
					limitsGrowth: oxygen.limitsGrowth ?? true
				}
			: null,
		// Without a transfer balance, Yx/O2 gives the O2 demand of the simulated growth.
		demandYieldXO2: oxygen ? null : (kinetics.yieldXO2 ?? null)
	};
}

/** The plan of a request its schema accepted. */
function planSimulation(request: SimulationRequest): SimulationPlan {
	const { mode, initial, oxygen, endH } = request;
	const dissolvedOxygenMgPerL = oxygen
		? (initial.dissolvedOxygenMgPerL ?? oxygen.saturationMgPerL)
		: 0;
	const plan: SimulationPlan = {
		mode,
		parameters: modelParameters(request),
		initialState: [
			initial.biomassGPerL,
			initial.substrateGPerL,
			initial.productGPerL ?? 0,
			initial.volumeL,
			dissolvedOxygenMgPerL
		],
		endH,
		outputTimesH: outputTimesH(endH, request.outputEveryH ?? defaultOutputEveryH(endH)),
		feeds: null,
		startH: 0,
		feedSubstrateGPerL: 0,
		maxVolumeL: request.maxVolumeL ?? null,
		continuous: null,
		drawFill: null
	};
	if (request.feeds) {
		plan.feeds = request.feeds.map((feed, i) => planFeed(feed, `feeds.${i}`));
		plan.startH = Math.min(...plan.feeds.map((feed) => feed.startH));
		return plan;
	}
	const feed = request.feed;
	if (mode === 'batch' || feed === undefined) return plan;
	plan.startH = feed.startH ?? 0;
	plan.feedSubstrateGPerL = feed.substrateGPerL;
	if (mode === 'fedBatch') plan.feeds = [planFeed(feed, 'feed')];
	else if (mode === 'drawFill') plan.drawFill = { ...request.drawFill! };
	else plan.continuous = continuousFlow(request);
	return plan;
}

function continuousFlow({
	mode,
	dilutionPerH,
	perfusion
}: SimulationRequest): SimulationPlan['continuous'] {
	const dilution = dilutionPerH!;
	if (mode !== 'perfusion') return { dilutionPerH: dilution, cellRemovalPerH: dilution };
	const { bleedPerH, retentionEfficiency } = perfusion!;
	return {
		dilutionPerH: dilution,
		cellRemovalPerH: bleedPerH + (dilution - bleedPerH) * (1 - retentionEfficiency)
	};
}

/** One fed-batch stream of a checked request; its strategy's fields are there (request-rules.ts). */
function planFeed(feed: FeedInput, field: string): FeedPlan {
	const common = {
		field,
		label: feed.label === undefined ? null : feed.label.trim(),
		substrateGPerL: feed.substrateGPerL,
		startH: feed.startH ?? 0,
		bolusL: feed.bolusL ?? 0,
		maxRateLPerH: feed.maxRateLPerH ?? Infinity
	};
	switch (feed.strategy) {
		case 'constant':
			return { ...common, strategy: 'constant', rateLPerH: feed.rateLPerH! };
		case 'linear':
			return {
				...common,
				strategy: 'linear',
				rateLPerH: feed.rateLPerH!,
				slopeLPerH2: feed.slopeLPerH2!
			};
		case 'exponential':
			return { ...common, strategy: 'exponential', muSetPerH: feed.muSetPerH! };
		case 'substrateStat':
			return { ...common, strategy: 'substrateStat', setpointGPerL: feed.setpointGPerL! };
		case 'doStat':
			return { ...common, strategy: 'doStat', doSetpointMgPerL: feed.doSetpointMgPerL! };
		case 'expression':
			return {
				...common,
				strategy: 'expression',
				expression: compileFeedExpression(feed.expression!, `${field}.expression`)
			};
	}
}
