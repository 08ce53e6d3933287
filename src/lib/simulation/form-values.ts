// The simulation form's state and its translation to and from the request of POST /api/v1/simulate.
// One table of fields drives rendering, request building and scenario loading, so they cannot drift;
// the feed streams' own table is in feed-stream-values.ts.
import {
	DEFAULT_OUTPUT_INTERVALS,
	fieldLabel,
	simulationRequestSchema,
	type FeedInput,
	type OperatingMode,
	type SimulationRequest
} from '$chemistry';
import { describeProblems, problemsByPath, zodProblems } from '$lib/field-problems';
import {
	buildFeedInput,
	createFeedStream,
	FED_BATCH_FEED_SUBSTRATE_TEXT,
	MAX_FORM_FEED_STREAMS,
	readFeedInput,
	type FeedStreamValues
} from './feed-stream-values';
import { readDecimalText } from '$lib/number-reading';

export { STRATEGY_LABELS } from './feed-stream-values';

export type FieldGroup = 'kinetics' | 'initial' | 'feed' | 'oxygen' | 'operation';

export interface SimulationFormValues {
	mode: OperatingMode;
	oxygenBalance: boolean;
	/** keyed by request path, e.g. `kinetics.muMaxPerH`; kept as typed so nothing is lost on error */
	numbers: Record<string, string>;
	/** at least one; fed-batch uses them all, the other modes only the first (their fresh medium) */
	feeds: FeedStreamValues[];
	/**
	 * the streams go as `feeds` even when there is one: set when a scenario saved that way is loaded,
	 * since a lone stream of `feeds` may carry no substrate, which the single `feed` refuses
	 */
	feedsAsList: boolean;
}

export interface NumberField {
	path: string;
	label: string;
	group: FieldGroup;
	hint?: string;
	shows?: (v: SimulationFormValues) => boolean;
}

const fed = (v: SimulationFormValues) => v.mode === 'fedBatch';
const continuous = (v: SimulationFormValues) => v.mode === 'chemostat' || v.mode === 'perfusion';

export const MODE_LABELS: Record<OperatingMode, string> = {
	batch: 'Batch',
	fedBatch: 'Fed-batch',
	chemostat: 'Chemostat',
	perfusion: 'Perfusion',
	drawFill: 'Draw-fill (repeated batch)'
};

export const GROUP_LEGENDS: Record<FieldGroup, string> = {
	kinetics: 'Kinetics',
	initial: 'Initial state',
	feed: 'Feed',
	oxygen: 'Oxygen transfer',
	operation: 'Operation'
};

/**
 * Each field with its unit; the label is the request field's own label (chemistry/field-labels.ts)
 * and the unit, so a refusal names the field as the form shows it.
 */
const FIELDS_WITH_UNITS: (Omit<NumberField, 'label'> & { unit: string })[] = [
	{ path: 'kinetics.muMaxPerH', unit: '1/h', group: 'kinetics' },
	{ path: 'kinetics.ksGPerL', unit: 'g/L', group: 'kinetics' },
	{
		path: 'kinetics.yieldXS',
		unit: 'g biomass / g substrate',
		group: 'kinetics'
	},
	{
		path: 'kinetics.maintenanceGPerGH',
		unit: 'g/g/h',
		group: 'kinetics',
		hint: 'Optional; Pirt 1965'
	},
	{
		path: 'kinetics.alpha',
		unit: 'g/g',
		group: 'kinetics',
		hint: 'Optional; growth-associated'
	},
	{
		path: 'kinetics.beta',
		unit: 'g/g/h',
		group: 'kinetics',
		hint: 'Optional; non-growth'
	},
	{ path: 'initial.biomassGPerL', unit: 'g/L', group: 'initial' },
	{ path: 'initial.substrateGPerL', unit: 'g/L', group: 'initial' },
	{ path: 'initial.volumeL', unit: 'L', group: 'initial' },
	{
		path: 'initial.productGPerL',
		unit: 'g/L',
		group: 'initial',
		hint: 'Optional; default 0'
	},
	{
		path: 'oxygen.kLaPerH',
		unit: '1/h',
		group: 'oxygen',
		shows: (v) => v.oxygenBalance
	},
	{
		path: 'oxygen.saturationMgPerL',
		unit: 'mg/L',
		group: 'oxygen',
		shows: (v) => v.oxygenBalance
	},
	{
		path: 'kinetics.yieldXO2',
		unit: 'g biomass / g O₂',
		group: 'oxygen',
		shows: (v) => v.oxygenBalance
	},
	{
		path: 'kinetics.koMgPerL',
		unit: 'mg/L',
		group: 'oxygen',
		hint: 'Optional; 0 = growth ignores DO',
		shows: (v) => v.oxygenBalance
	},
	{
		path: 'oxygen.maintenanceMgPerGH',
		unit: 'mg/g/h',
		group: 'oxygen',
		hint: 'Optional',
		shows: (v) => v.oxygenBalance
	},
	{
		path: 'initial.dissolvedOxygenMgPerL',
		unit: 'mg/L',
		group: 'oxygen',
		hint: 'Optional; default C*',
		shows: (v) => v.oxygenBalance
	},
	{
		path: 'dilutionPerH',
		unit: '1/h',
		group: 'operation',
		shows: continuous
	},
	{
		path: 'perfusion.retentionEfficiency',
		unit: 'fraction 0–1',
		group: 'operation',
		shows: (v) => v.mode === 'perfusion'
	},
	{
		path: 'perfusion.bleedPerH',
		unit: 'vessel volumes/h',
		group: 'operation',
		shows: (v) => v.mode === 'perfusion'
	},
	{
		path: 'drawFill.fraction',
		unit: '0–1',
		group: 'operation',
		shows: (v) => v.mode === 'drawFill'
	},
	{
		path: 'drawFill.everyH',
		unit: 'h',
		group: 'operation',
		shows: (v) => v.mode === 'drawFill'
	},
	{
		path: 'maxVolumeL',
		unit: 'L',
		group: 'operation',
		hint: 'The run stops there',
		shows: fed
	},
	{ path: 'endH', unit: 'h', group: 'operation' },
	{
		path: 'outputEveryH',
		unit: 'h',
		group: 'operation',
		hint: `Optional; blank gives at most ${DEFAULT_OUTPUT_INTERVALS.toLocaleString('en')} intervals`
	}
];

export const NUMBER_FIELDS: NumberField[] = FIELDS_WITH_UNITS.map(({ unit, ...field }) => ({
	...field,
	label: `${fieldLabel(field.path)} (${unit})`
}));

/** A bacterium on glucose, exponentially fed after an 8 h batch, with an O2 balance. */
export function createDemoValues(): SimulationFormValues {
	return {
		mode: 'fedBatch',
		oxygenBalance: true,
		feeds: [
			createFeedStream({
				strategy: 'exponential',
				expression: '0.05 * exp(0.2 * (t - 8))',
				numbers: {
					substrateGPerL: FED_BATCH_FEED_SUBSTRATE_TEXT,
					startH: '8',
					rateLPerH: '0.1',
					slopeLPerH2: '0.02',
					muSetPerH: '0.2',
					setpointGPerL: '0.1',
					doSetpointMgPerL: '2',
					maxRateLPerH: '',
					bolusL: ''
				}
			})
		],
		feedsAsList: false,
		numbers: {
			'kinetics.muMaxPerH': '0.6',
			'kinetics.ksGPerL': '0.05',
			'kinetics.yieldXS': '0.5',
			'kinetics.maintenanceGPerGH': '0.03',
			'kinetics.alpha': '',
			'kinetics.beta': '',
			'initial.biomassGPerL': '0.1',
			'initial.substrateGPerL': '20',
			'initial.volumeL': '5',
			'initial.productGPerL': '',
			'oxygen.kLaPerH': '500',
			'oxygen.saturationMgPerL': '7',
			'kinetics.yieldXO2': '1',
			'kinetics.koMgPerL': '0.1',
			'oxygen.maintenanceMgPerGH': '',
			'initial.dissolvedOxygenMgPerL': '',
			dilutionPerH: '0.3',
			'perfusion.retentionEfficiency': '0.95',
			'perfusion.bleedPerH': '0.05',
			'drawFill.fraction': '0.5',
			'drawFill.everyH': '12',
			maxVolumeL: '12',
			endH: '24',
			outputEveryH: '0.1'
		}
	};
}

/**
 * The first stream's substrate the form gives a mode: fed-batch feeds a concentrate; chemostat,
 * perfusion and draw-fill feed fresh medium, by default the medium the vessel starts with (S₀).
 */
export function defaultFeedSubstrateText(
	values: SimulationFormValues,
	mode: OperatingMode
): string {
	return mode === 'fedBatch'
		? FED_BATCH_FEED_SUBSTRATE_TEXT
		: (values.numbers['initial.substrateGPerL'] ?? '').trim();
}

/**
 * Changes the operating mode. A first stream's substrate still at the old mode's default takes the
 * new mode's (a fed-batch concentrate is no chemostat's fresh medium); one the user typed stays.
 */
export function switchOperatingMode(values: SimulationFormValues, mode: OperatingMode): void {
	const first = values.feeds[0];
	if (
		first &&
		first.numbers.substrateGPerL.trim() === defaultFeedSubstrateText(values, values.mode)
	)
		first.numbers.substrateGPerL = defaultFeedSubstrateText(values, mode);
	values.mode = mode;
}

export function isFieldShown(field: NumberField, values: SimulationFormValues): boolean {
	return field.shows ? field.shows(values) : true;
}

function setPath(target: Record<string, unknown>, path: string, value: unknown): void {
	const keys = path.split('.');
	let node = target;
	for (const key of keys.slice(0, -1)) node = (node[key] ??= {}) as Record<string, unknown>;
	node[keys[keys.length - 1]] = value;
}

function getPath(source: unknown, path: string): unknown {
	return path
		.split('.')
		.reduce<unknown>(
			(node, key) =>
				node && typeof node === 'object' ? (node as Record<string, unknown>)[key] : undefined,
			source
		);
}

/**
 * A request, or why not: `fieldErrors` by request path; `message` is the API's own sentence when the
 * request schema refused it (absent when only typed text was not a number).
 */
export type BuiltRequest =
	| { ok: true; request: SimulationRequest }
	| { ok: false; fieldErrors: Record<string, string>; message?: string };

/** Whether the request carries the streams as `feeds` (so their fields are `feeds.N.…`) rather than `feed`. */
export function usesFeedsList(values: SimulationFormValues): boolean {
	return values.mode === 'fedBatch' && (values.feeds.length > 1 || values.feedsAsList);
}

/** The request path of a stream's fields: `feed`, or `feeds.N` with several streams. */
export function feedStreamPath(values: SimulationFormValues, index: number): string {
	return usesFeedsList(values) ? `feeds.${index}` : 'feed';
}

/** The streams the request carries: all of them in fed-batch, the fresh medium's in the other feeding modes. */
export function feedStreamsUsed(values: SimulationFormValues): FeedStreamValues[] {
	if (values.mode === 'batch') return [];
	return values.mode === 'fedBatch' ? values.feeds : values.feeds.slice(0, 1);
}

/**
 * The request for the fields now shown, checked with the request schema the API validates with
 * (`simulationRequestSchema`), so the form refuses what the API refuses in the API's words. The form
 * itself only reads typed text as numbers: text that is not one is its own error, and a blank field
 * is left out for the schema to judge.
 */
export function buildSimulationRequest(values: SimulationFormValues): BuiltRequest {
	const request: Record<string, unknown> = { mode: values.mode };
	const textErrors: Record<string, string> = {};
	for (const field of NUMBER_FIELDS) {
		if (!isFieldShown(field, values)) continue;
		const text = (values.numbers[field.path] ?? '').trim();
		if (text === '') continue;
		const read = readDecimalText(text, field.label);
		if (!read.ok) textErrors[field.path] = read.message;
		else setPath(request, field.path, read.value);
	}
	const feeds: FeedInput[] = [];
	feedStreamsUsed(values).forEach((stream, i) => {
		const built = buildFeedInput(stream, values.mode, feedStreamPath(values, i));
		feeds.push(built.feed);
		Object.assign(textErrors, built.textErrors);
	});
	if (usesFeedsList(values)) request.feeds = feeds;
	else if (feeds.length) request.feed = feeds[0];
	const checked = simulationRequestSchema.safeParse(request);
	if (Object.keys(textErrors).length) {
		// A field whose text is not a number keeps that error; the schema's word on it (missing) would mislead.
		const others = checked.success ? {} : problemsByPath(zodProblems(checked.error.issues));
		return { ok: false, fieldErrors: { ...textErrors, ...withoutKeys(others, textErrors) } };
	}
	if (!checked.success) {
		const problems = zodProblems(checked.error.issues);
		return {
			ok: false,
			fieldErrors: problemsByPath(problems),
			message: describeProblems(problems)
		};
	}
	return { ok: true, request: checked.data };
}

function withoutKeys(errors: Record<string, string>, taken: Record<string, string>) {
	return Object.fromEntries(Object.entries(errors).filter(([path]) => !(path in taken)));
}

export type ReadRequest =
	{ ok: true; values: SimulationFormValues } | { ok: false; message: string };

/**
 * The form as it was when a scenario was saved; fields the scenario does not use keep the demo values.
 * A scenario with more feed streams than the page edits is refused rather than cut.
 */
export function readSimulationRequest(request: SimulationRequest): ReadRequest {
	const asList =
		request.mode === 'fedBatch' && Array.isArray(request.feeds) && request.feeds.length > 0;
	const streams = asList ? request.feeds! : request.feed ? [request.feed] : [];
	if (streams.length > MAX_FORM_FEED_STREAMS) {
		return {
			ok: false,
			message: `This scenario has ${streams.length} feed streams and this page edits at most ${MAX_FORM_FEED_STREAMS}: the form is as you left it and the saved scenario is unchanged. To see its run, tick it and another scenario and overlay them.`
		};
	}
	const values = createDemoValues();
	values.mode = request.mode;
	values.oxygenBalance = request.oxygen !== undefined && request.oxygen !== null;
	values.feedsAsList = asList;
	if (streams.length)
		values.feeds = streams.map((feed, i) =>
			readFeedInput(feed, request.mode, i === 0 ? values.feeds[0] : createFeedStream())
		);
	for (const field of NUMBER_FIELDS) {
		if (!isFieldShown(field, values)) continue;
		const value = getPath(request, field.path);
		values.numbers[field.path] = typeof value === 'number' ? String(value) : '';
	}
	return { ok: true, values };
}
