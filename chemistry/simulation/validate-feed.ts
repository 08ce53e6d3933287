// Reading the fed-batch feed: the single `feed`, or the several streams of `feeds`.
import { ChemistryInputError } from '../errors';
import { compileFeedExpression, type FeedExpression } from './expression';
import { MAX_INFLOW_VOLUMES_PER_H, V } from './model';
import { isGiven, NON_NEGATIVE, POSITIVE, readNumber, readOptional } from './read-number';
import type { FeedInput, SimulationRequest } from './types';
import type { SimulationPlan } from './validate';

/** Most feed streams accepted in one fed-batch run. */
export const MAX_FEED_STREAMS = 8;
/** Longest feed label accepted, in characters. */
export const MAX_FEED_LABEL_LENGTH = 80;

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

/** Which feed fields each strategy reads, so a field it would ignore is refused rather than dropped. */
const FEED_FIELDS: Record<FeedInput['strategy'], readonly (keyof FeedInput)[]> = {
	constant: ['rateLPerH'],
	linear: ['rateLPerH', 'slopeLPerH2', 'maxRateLPerH'],
	exponential: ['muSetPerH', 'maxRateLPerH'],
	substrateStat: ['setpointGPerL', 'maxRateLPerH'],
	doStat: ['doSetpointMgPerL', 'maxRateLPerH'],
	expression: ['expression', 'maxRateLPerH']
};
export const FLOW_FIELDS: readonly (keyof FeedInput)[] = [
	'rateLPerH',
	'slopeLPerH2',
	'muSetPerH',
	'setpointGPerL',
	'doSetpointMgPerL',
	'expression',
	'maxRateLPerH',
	'bolusL'
];

/**
 * The streams of `feeds`, each read like the single `feed` with its fields under `feeds.N`. A stream
 * may carry none of the modelled substrate (S_f = 0, e.g. an amino-acid feed) unless its law divides
 * by S_f − S (exponential, substrate-stat).
 */
export function readFeedStreams(request: SimulationRequest, plan: SimulationPlan): FeedPlan[] {
	if (plan.mode !== 'fedBatch') {
		const instead =
			plan.mode === 'batch'
				? 'a batch run takes no feed; use fedBatch mode to feed'
				: `in ${plan.mode} mode give the fresh medium as feed`;
		throw new ChemistryInputError(
			`feeds (several feed streams) is used only in fedBatch mode; ${instead}.`,
			{ field: 'feeds' }
		);
	}
	if (isGiven(request.feed)) {
		throw new ChemistryInputError(
			'Give either feed (one stream) or feeds (several streams), not both.',
			{ field: 'feeds' }
		);
	}
	const feeds: unknown = request.feeds;
	if (!Array.isArray(feeds) || feeds.length === 0 || feeds.length > MAX_FEED_STREAMS) {
		throw new ChemistryInputError(
			`feeds must be a list of 1 to ${MAX_FEED_STREAMS} feed streams${Array.isArray(feeds) ? ` (got ${feeds.length})` : ''}.`,
			{ field: 'feeds' }
		);
	}
	const streams = feeds.map((feed: unknown, i) => readFeedStream(feed, plan, `feeds.${i}`));
	checkBolusesFit(streams, plan);
	return streams;
}

function readFeedStream(feed: unknown, plan: SimulationPlan, field: string): FeedPlan {
	if (feed === null || typeof feed !== 'object' || Array.isArray(feed)) {
		throw new ChemistryInputError(
			`${field} must be a feed stream (an object with strategy, substrateGPerL, …).`,
			{ field }
		);
	}
	const input = feed as FeedInput;
	const substrateGPerL = readNumber(input.substrateGPerL, `${field}.substrateGPerL`, NON_NEGATIVE);
	const startH = readOptional(input.startH, `${field}.startH`, 0, NON_NEGATIVE);
	if (startH >= plan.endH) {
		throw new ChemistryInputError(
			`${field}.startH (${startH} h) must be before endH (${plan.endH} h).`,
			{ field: `${field}.startH` }
		);
	}
	return readFedBatchFeed(input, plan, { field, substrateGPerL, startH, form: 'streams' });
}

/**
 * The volume only grows in fed-batch, so boluses that add up (in start order) beyond the maximum
 * volume would overflow whatever the feeding in between.
 */
function checkBolusesFit(streams: FeedPlan[], plan: SimulationPlan): void {
	const maxVolumeL = plan.maxVolumeL;
	if (maxVolumeL === null) return;
	const byStart = streams.slice().sort((a, b) => a.startH - b.startH);
	let volumeL = plan.initialState[V];
	for (const stream of byStart) {
		volumeL += stream.bolusL;
		if (volumeL > maxVolumeL) {
			throw new ChemistryInputError(
				`${stream.field}.bolusL (${stream.bolusL} L) would take the volume, with the boluses before it, to ${volumeL} L, above maxVolumeL (${maxVolumeL} L).`,
				{ field: `${stream.field}.bolusL` }
			);
		}
	}
}

function readFeedLabel(value: unknown, field: string): string | null {
	if (!isGiven(value)) return null;
	if (typeof value !== 'string' || value.trim() === '') {
		throw new ChemistryInputError(`${field} must be a non-empty text.`, { field });
	}
	const label = value.trim();
	if (label.length > MAX_FEED_LABEL_LENGTH) {
		throw new ChemistryInputError(
			`${field} must be at most ${MAX_FEED_LABEL_LENGTH} characters (got ${label.length}).`,
			{ field }
		);
	}
	return label;
}

/**
 * One fed-batch stream's strategy and settings, with `substrateGPerL` and `startH` already read.
 * `form` is 'single' for the request's `feed`, whose rules stay as they were before `feeds`.
 */
export function readFedBatchFeed(
	feed: FeedInput,
	plan: SimulationPlan,
	stream: { field: string; substrateGPerL: number; startH: number; form: 'single' | 'streams' }
): FeedPlan {
	const { field, substrateGPerL, startH } = stream;
	const strategy = feed.strategy;
	const allowed = Object.hasOwn(FEED_FIELDS, strategy) ? FEED_FIELDS[strategy] : undefined;
	if (allowed === undefined) {
		throw new ChemistryInputError(
			`${field}.strategy must be one of ${Object.keys(FEED_FIELDS).join(', ')}.`,
			{
				field: `${field}.strategy`
			}
		);
	}
	for (const name of FLOW_FIELDS) {
		if (name !== 'bolusL' && !allowed.includes(name) && isGiven(feed[name])) {
			throw new ChemistryInputError(
				`${field}.${name} is not used by the ${strategy} strategy (it reads ${allowed.map((f) => `${field}.${f}`).join(', ')}).`,
				{ field: `${field}.${name}` }
			);
		}
	}
	const label = readFeedLabel(feed.label, `${field}.label`);
	const [, s0, , v0] = plan.initialState;
	const { muMaxPerH } = plan.parameters;
	const bolusL = readOptional(feed.bolusL, `${field}.bolusL`, 0, NON_NEGATIVE);
	if (plan.maxVolumeL !== null && v0 + bolusL > plan.maxVolumeL) {
		throw new ChemistryInputError(
			`${field}.bolusL (${bolusL} L) would take the volume to ${v0 + bolusL} L, above maxVolumeL (${plan.maxVolumeL} L).`,
			{ field: `${field}.bolusL` }
		);
	}
	const maxRateLPerH = readOptional(
		feed.maxRateLPerH,
		`${field}.maxRateLPerH`,
		Infinity,
		POSITIVE
	);
	const common = { field, label, substrateGPerL, startH, bolusL, maxRateLPerH };
	// Substrate only falls before the feed starts, and a bolus of feed moves it towards S_f, so
	// checking S_f against the initial S covers the feed start as well.
	const requireFeedAboveInitial = (why: string) => {
		if (substrateGPerL <= s0) {
			throw new ChemistryInputError(
				`${field}.substrateGPerL (${substrateGPerL} g/L) must exceed initial.substrateGPerL (${s0} g/L) for ${why}.`,
				{ field: `${field}.substrateGPerL` }
			);
		}
	};
	switch (strategy) {
		case 'constant': {
			const rateLPerH = readNumber(feed.rateLPerH, `${field}.rateLPerH`, POSITIVE);
			if (rateLPerH > MAX_INFLOW_VOLUMES_PER_H * v0) {
				throw new ChemistryInputError(
					`${field}.rateLPerH (${rateLPerH} L/h) would bring in more than ${MAX_INFLOW_VOLUMES_PER_H} times the initial volume (${v0} L) per hour: check its units (L/h).`,
					{ field: `${field}.rateLPerH` }
				);
			}
			return { ...common, strategy, rateLPerH };
		}
		case 'linear': {
			const rateLPerH = readNumber(feed.rateLPerH, `${field}.rateLPerH`, NON_NEGATIVE);
			const slopeLPerH2 = readNumber(feed.slopeLPerH2, `${field}.slopeLPerH2`);
			if (rateLPerH === 0 && slopeLPerH2 <= 0) {
				throw new ChemistryInputError(
					`A linear feed starting at 0 L/h needs a positive ${field}.slopeLPerH2.`,
					{
						field: `${field}.slopeLPerH2`
					}
				);
			}
			return { ...common, strategy, rateLPerH, slopeLPerH2 };
		}
		case 'exponential': {
			const muSetPerH = readNumber(feed.muSetPerH, `${field}.muSetPerH`, POSITIVE);
			if (muSetPerH >= muMaxPerH) {
				throw new ChemistryInputError(
					`${field}.muSetPerH (${muSetPerH} /h) must be below kinetics.muMaxPerH (${muMaxPerH} /h); the culture cannot grow faster than μmax.`,
					{ field: `${field}.muSetPerH` }
				);
			}
			requireFeedAboveInitial('an exponential feed');
			return { ...common, strategy, muSetPerH };
		}
		case 'substrateStat': {
			// Among several streams, S can only be held from below by a feed richer than the broth.
			if (stream.form === 'streams') requireFeedAboveInitial('a substrate-stat feed');
			const setpointGPerL = readNumber(feed.setpointGPerL, `${field}.setpointGPerL`, POSITIVE);
			if (setpointGPerL >= substrateGPerL) {
				throw new ChemistryInputError(
					`${field}.setpointGPerL (${setpointGPerL} g/L) must be below ${field}.substrateGPerL (${substrateGPerL} g/L).`,
					{ field: `${field}.setpointGPerL` }
				);
			}
			return { ...common, strategy, setpointGPerL };
		}
		case 'doStat': {
			const o2 = plan.parameters.oxygen;
			if (o2 === null) {
				throw new ChemistryInputError(
					'A DO-stat feed needs the oxygen block (kLaPerH, saturationMgPerL).',
					{
						field: 'oxygen'
					}
				);
			}
			if (!Number.isFinite(maxRateLPerH)) {
				throw new ChemistryInputError(
					`A DO-stat feed needs ${field}.maxRateLPerH, the pump rate with DO above the setpoint.`,
					{
						field: `${field}.maxRateLPerH`
					}
				);
			}
			const doSetpointMgPerL = readNumber(feed.doSetpointMgPerL, `${field}.doSetpointMgPerL`, {
				min: 0,
				max: o2.saturationMgPerL
			});
			return { ...common, strategy, doSetpointMgPerL };
		}
		case 'expression':
			if (typeof feed.expression !== 'string') {
				throw new ChemistryInputError(`The expression strategy needs ${field}.expression.`, {
					field: `${field}.expression`
				});
			}
			return {
				...common,
				strategy,
				expression: compileFeedExpression(feed.expression, `${field}.expression`)
			};
	}
	throw new ChemistryInputError(`${field}.strategy is not recognised.`, {
		field: `${field}.strategy`
	});
}
