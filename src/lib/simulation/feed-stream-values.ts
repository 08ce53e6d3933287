// One feed stream as the simulation form holds it, and its translation to and from a FeedInput.
// The table of feed fields drives the stream's inputs, its part of the request and scenario loading.
import {
	FEED_STRATEGY_LABELS,
	type FeedInput,
	type FeedStrategy,
	type OperatingMode
} from '$chemistry';
import { readDecimalText } from '$lib/number-reading';

/** Streams the simulation page edits; the API takes more (the science library's MAX_FEED_STREAMS). */
export const MAX_FORM_FEED_STREAMS = 3;
/** The science library's MAX_FEED_LABEL_LENGTH, repeated so the browser does not load the solver. */
export const FEED_LABEL_MAX_LENGTH = 80;

export type FeedNumberKey =
	| 'substrateGPerL'
	| 'startH'
	| 'rateLPerH'
	| 'slopeLPerH2'
	| 'muSetPerH'
	| 'setpointGPerL'
	| 'doSetpointMgPerL'
	| 'maxRateLPerH'
	| 'bolusL';

export interface FeedStreamValues {
	/** stays with the stream when others are added or removed: list key and focus target */
	key: string;
	label: string;
	strategy: FeedStrategy;
	expression: string;
	/** kept as typed so nothing is lost on error */
	numbers: Record<FeedNumberKey, string>;
}

export interface FeedNumberField {
	key: FeedNumberKey;
	label: string;
	/** a hint, or one per mode where what the field means changes with it */
	hint?: string | ((mode: OperatingMode) => string);
	shows: (stream: FeedStreamValues, mode: OperatingMode) => boolean;
}

export const STRATEGY_LABELS: Record<FeedStrategy, string> = FEED_STRATEGY_LABELS;

const fedWith =
	(...strategies: FeedStrategy[]) =>
	(stream: FeedStreamValues, mode: OperatingMode) =>
		mode === 'fedBatch' && strategies.includes(stream.strategy);

export const FEED_NUMBER_FIELDS: FeedNumberField[] = [
	{
		key: 'substrateGPerL',
		label: 'Substrate in feed or fresh medium Sf (g/L)',
		hint: (mode) =>
			mode === 'fedBatch'
				? `Default ${FED_BATCH_FEED_SUBSTRATE_TEXT} g/L: a concentrated feed (common practice)`
				: 'Fresh medium; default S₀, the medium the vessel starts with',
		shows: (_, mode) => mode !== 'batch'
	},
	{
		key: 'startH',
		label: 'Start (h)',
		hint: 'Batch phase before it; default 0',
		shows: (_, mode) => mode !== 'batch'
	},
	{
		key: 'rateLPerH',
		label: 'Feed rate F (L/h)',
		shows: fedWith('constant', 'linear')
	},
	{ key: 'slopeLPerH2', label: 'Ramp slope (L/h²)', shows: fedWith('linear') },
	{
		key: 'muSetPerH',
		label: 'Set growth rate μset (1/h)',
		shows: fedWith('exponential')
	},
	{
		key: 'setpointGPerL',
		label: 'Substrate setpoint (g/L)',
		shows: fedWith('substrateStat')
	},
	{
		key: 'doSetpointMgPerL',
		label: 'DO setpoint (mg/L)',
		shows: fedWith('doStat')
	},
	{
		key: 'maxRateLPerH',
		label: 'Pump maximum (L/h)',
		hint: 'Caps the feed rate',
		shows: fedWith('linear', 'exponential', 'substrateStat', 'doStat', 'expression')
	},
	{
		key: 'bolusL',
		label: 'Bolus at start (L)',
		hint: 'Optional',
		shows: (_, mode) => mode === 'fedBatch'
	}
];

/**
 * The substrate of a fed-batch feed the form starts with, g/L: a concentrate, so that feeding adds
 * little volume (glucose feeds of 400–600 g/L are common practice).
 */
export const FED_BATCH_FEED_SUBSTRATE_TEXT = '500';

/** A field's hint in this mode. */
export function feedFieldHint(field: FeedNumberField, mode: OperatingMode): string | undefined {
	return typeof field.hint === 'function' ? field.hint(mode) : field.hint;
}

let lastStreamKey = 0;

function blankNumbers(): Record<FeedNumberKey, string> {
	return Object.fromEntries(FEED_NUMBER_FIELDS.map((field) => [field.key, ''])) as Record<
		FeedNumberKey,
		string
	>;
}

/** A stream as "Add a feed stream" gives it: constant, nothing typed yet. */
export function createFeedStream(
	start: Partial<Omit<FeedStreamValues, 'key'>> = {}
): FeedStreamValues {
	lastStreamKey += 1;
	return {
		key: `feed-stream-${lastStreamKey}`,
		label: '',
		strategy: 'constant',
		expression: '',
		...start,
		numbers: { ...blankNumbers(), ...start.numbers }
	};
}

export function feedFieldsShown(stream: FeedStreamValues, mode: OperatingMode): FeedNumberField[] {
	return FEED_NUMBER_FIELDS.filter((field) => field.shows(stream, mode));
}

/** A stream's FeedInput as typed, and the fields whose text is not a number. */
export interface BuiltFeed {
	feed: FeedInput;
	textErrors: Record<string, string>;
}

/**
 * One stream's FeedInput; `path` (`feed` or `feeds.N`) names its fields in the errors. Blank fields
 * are left out: which ones a stream needs, and the label's length, are the request schema's to judge.
 */
export function buildFeedInput(
	stream: FeedStreamValues,
	mode: OperatingMode,
	path: string
): BuiltFeed {
	const feed: Record<string, unknown> = {};
	const textErrors: Record<string, string> = {};
	for (const field of feedFieldsShown(stream, mode)) {
		const text = (stream.numbers[field.key] ?? '').trim();
		if (text === '') continue;
		const read = readDecimalText(text, field.label);
		if (!read.ok) textErrors[`${path}.${field.key}`] = read.message;
		else feed[field.key] = read.value;
	}
	feed.strategy = mode === 'fedBatch' ? stream.strategy : 'constant';
	if (mode === 'fedBatch') {
		if (stream.strategy === 'expression') feed.expression = stream.expression;
		const label = stream.label.trim();
		if (label !== '') feed.label = label;
	}
	return { feed: feed as unknown as FeedInput, textErrors };
}

/**
 * A request's stream in the form, on top of `base`: the fields this stream's strategy shows are
 * taken from the request (blank when it has none), the others keep what `base` holds.
 */
export function readFeedInput(
	feed: FeedInput,
	mode: OperatingMode,
	base: FeedStreamValues
): FeedStreamValues {
	const stream: FeedStreamValues = {
		...base,
		numbers: { ...base.numbers },
		strategy: mode === 'fedBatch' ? feed.strategy : base.strategy,
		label: typeof feed.label === 'string' ? feed.label : ''
	};
	if (typeof feed.expression === 'string') stream.expression = feed.expression;
	for (const field of feedFieldsShown(stream, mode)) {
		const value = feed[field.key];
		stream.numbers[field.key] = typeof value === 'number' ? String(value) : '';
	}
	return stream;
}

/**
 * Field errors follow their stream when streams are added or removed, so the paths that move
 * (`feed.x` to `feeds.0.x` and back, `feeds.2.x` to `feeds.1.x`) keep pointing at the same inputs;
 * a removed stream's errors go with it. `moves` pairs each stream's path before with its path after
 * (null: removed). A bare `feed` stays: it is the feed block's own error.
 */
export function moveFeedStreamErrors(
	errors: Record<string, string>,
	moves: { from: string; to: string | null }[]
): Record<string, string> {
	const moved: Record<string, string> = {};
	for (const [path, text] of Object.entries(errors)) {
		const move = moves.find(
			({ from }) => path.startsWith(`${from}.`) || (from !== 'feed' && path === from)
		);
		if (!move) moved[path] = text;
		else if (move.to !== null) moved[move.to + path.slice(move.from.length)] = text;
	}
	return moved;
}
