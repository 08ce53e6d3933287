import { DEFAULT_ELEMENT_ROLES_BASIS } from '../data/element-roles';
import {
	DEFAULT_IGNORED_ELEMENTS,
	DEFAULT_SAFETY_FACTOR,
	assessSufficiency,
	type SufficiencyResult
} from '../sufficiency';
import { asStudyDataError } from './errors';
import { holdToNutrients, type NutrientHold } from './nutrient-hold';
import { findEmptyTime, findRunoutTimes, type RunoutInput } from './nutrient-runout';
import { listYieldsUsed, toSufficiencyProfile } from './profile';
import type { OperatingPoint, ReportLog, StudyRun } from './report-context';
import { isControlled } from './time-course';
import type { FeedReport, NutrientRow, StudyInputs } from './types';

export interface NutrientSection {
	sufficiency: SufficiencyResult;
	lines: NutrientRow[];
	limitLine: NutrientRow;
	/** What each feed counts in the nutrient table, L, aligned with the feeds. */
	usedL: number[];
	feedUsedL: number;
	finalVolumeL: number;
	/** The time course's biomass held to what the required nutrients supply; null without a course. */
	hold: NutrientHold | null;
}

/** A component's or element's name as the report shows it. */
export function nameOf(inputs: StudyInputs, key: string, basis: 'element' | 'component'): string {
	return basis === 'element' ? key : (inputs.componentNames[key] ?? key);
}

function listNutrientDefaults(inputs: StudyInputs, sufficiency: SufficiencyResult, log: ReportLog) {
	const { plan, profile } = inputs;
	if (plan.safetyFactor === DEFAULT_SAFETY_FACTOR)
		defaults(log, {
			what: 'Safety factor',
			value: String(DEFAULT_SAFETY_FACTOR),
			source: 'Common practice (the study keeps the suggested value)'
		});
	if (profile.kind === 'elementalFractions') {
		defaults(log, {
			what: 'Elements not assessed',
			value: DEFAULT_IGNORED_ELEMENTS.join(', '),
			source: 'Cells take H and O from water and O2, not from dissolved salts'
		});
	}
	if (profile.elementalFractions && profile.fractionsSource) {
		defaults(log, {
			what: 'Elemental mass fractions',
			value: 'from the profile',
			source: profile.fractionsSource
		});
	}
	const ownRoles = sufficiency.lines
		.filter((l) => l.roleFrom === 'profile')
		.map((l) => `${l.key} ${l.role}`);
	if (sufficiency.lines.some((l) => l.basis === 'element' && l.roleFrom === 'default')) {
		defaults(log, {
			what: 'Roles of the elements (required or trace)',
			value: ownRoles.length ? `default, except ${ownRoles.join(', ')} (the profile's)` : 'default',
			source: DEFAULT_ELEMENT_ROLES_BASIS
		});
	}
}

const defaults = (log: ReportLog, entry: ReportLog['defaults'][number]) => log.defaults.push(entry);

/**
 * The nutrient table: what the basal medium and the feeds (a controlled feed counts what the run
 * drew from it, at most what is available) supply against safety factor × demand, with the time
 * each nutrient runs out along the simulated run.
 */
export function assessNutrients(
	inputs: StudyInputs,
	point: OperatingPoint,
	run: StudyRun,
	log: ReportLog
): NutrientSection {
	const { plan } = inputs;
	const { feeds, target } = point;
	const { simulated, growth } = run;
	const { profile: sufficiencyProfile, carbon, substrates } = toSufficiencyProfile(inputs.profile);
	log.defaults.push(...listYieldsUsed(inputs.profile, inputs));
	const usedL = feeds.map((f, k) =>
		isControlled(f) && simulated
			? Math.min(simulated.deliveries[k].deliveredL, f.volumeL)
			: f.volumeL
	);
	const feedUsedL = usedL.reduce((a, b) => a + b, 0);
	const finalVolumeL = plan.initialVolumeL + feedUsedL;
	const sufficiency: SufficiencyResult = asStudyDataError(() =>
		assessSufficiency({
			profile: sufficiencyProfile,
			target: { biomassGPerL: target.biomassGPerL },
			supply: {
				finalVolumeL,
				sources: [
					{ name: inputs.basal.label, volumeL: plan.initialVolumeL, ...inputs.basal.composition },
					...feeds.flatMap((f, k) =>
						usedL[k] > 0 ? [{ name: f.label, volumeL: usedL[k], ...f.composition }] : []
					)
				]
			},
			safetyFactor: plan.safetyFactor,
			carbon,
			substrates
		})
	);
	listNutrientDefaults(inputs, sufficiency, log);
	const isCarbon = (l: { basis: string; key: string }) =>
		l.basis === 'component' && l.key === growth.carbonSourceId;
	const runoutInput: RunoutInput | null = simulated && {
		lines: sufficiency.lines,
		targetBiomassGPerL: target.biomassGPerL,
		basal: inputs.basal,
		initialVolumeL: plan.initialVolumeL,
		feeds,
		availableL: feeds.map((f) => f.volumeL),
		course: simulated
	};
	// Required nutrients hold growth back (the model itself follows only the carbon source); a trace
	// element that runs short is a warning and does not.
	const hold =
		runoutInput &&
		holdToNutrients(
			runoutInput,
			sufficiency.lines.map((l) => l.role === 'required' && !isCarbon(l))
		);
	const runouts = runoutInput
		? findRunoutTimes(runoutInput, hold!.heldToG)
		: sufficiency.lines.map(() => null);
	const lines: NutrientRow[] = sufficiency.lines.map((l, i) => {
		// The model follows the carbon source itself: its exhaustion is an event of the time course.
		const runout = isCarbon(l) ? null : runouts[i];
		const noRunout = isCarbon(l)
			? 'modelled'
			: !simulated
				? 'no time course'
				: runout === null
					? 'lasts'
					: null;
		return { ...l, name: nameOf(inputs, l.key, l.basis), runout, noRunout };
	});
	// Only required nutrients limit; a short trace element is among the warnings.
	const limitLine = lines.find(
		(l) => l.key === sufficiency.limiting!.key && l.basis === sufficiency.limiting!.basis
	)!;
	if (!sufficiency.sufficient) {
		const short = lines.filter((l) => l.role === 'required' && !l.sufficient).map((l) => l.name);
		log.reasons.push(
			`${short.join(', ')} ${short.length === 1 ? 'runs' : 'run'} short of ${plan.safetyFactor} × demand; ${limitLine.name} limits first, at about ${limitLine.maxBiomassGPerL?.toPrecision(3)} g/L.`
		);
	}
	return { sufficiency, lines, limitLine, usedL, feedUsedL, finalVolumeL, hold };
}

/** Each feed as planned and as the run drew it; a controlled feed that runs dry is a reason. */
export function reportFeeds(
	point: OperatingPoint,
	run: StudyRun,
	usedL: number[],
	log: ReportLog
): FeedReport[] {
	const { simulated } = run;
	const feedReports: FeedReport[] = point.feeds.map((f, k) => {
		const controlled = isControlled(f);
		const delivery = simulated?.deliveries[k] ?? null;
		const emptyAtH =
			controlled && simulated && delivery
				? findEmptyTime(simulated.t, delivery.cumulativeL, f.volumeL)
				: null;
		return {
			label: f.label,
			versionId: f.versionId,
			strategy: f.plan.strategy,
			startH: f.plan.startH,
			controlled,
			volumeL: f.volumeL,
			deliveredL: delivery?.deliveredL ?? null,
			usedL: usedL[k],
			emptyAtH
		};
	});
	for (const f of feedReports) {
		if (f.emptyAtH !== null) {
			log.reasons.push(
				`${f.label} runs dry at about ${f.emptyAtH.toFixed(0)} h: its plan would draw ${f.deliveredL!.toPrecision(3)} L, but ${f.volumeL} L are available.`
			);
		}
	}
	return feedReports;
}

/**
 * What the run-out times mean for a real run. The time course holds biomass to what the required
 * nutrients supply, so a required nutrient's shortfall is in it: from then on growth runs only as
 * fast as that nutrient arrives. A lasting shortfall is also a reason when its ratio is below 1. A
 * trace element's shortfall is not in the time course: its warning says what it would do.
 */
export function describeRunouts(
	lines: NutrientRow[],
	carbonName: string
): { notes: string[]; warnings: string[] } {
	const short = lines
		.filter((l) => l.runout !== null)
		.sort((a, b) => a.runout!.shortFromH - b.runout!.shortFromH);
	if (short.length === 0) return { notes: [], warnings: [] };
	const at = (h: number) => (h <= 0 ? 'from the start' : `at about ${h.toFixed(0)} h`);
	// A trace element that stays short already has its warning, and does not stop growth.
	const lasting = short.filter((l) => l.runout!.coveredAgainH === null && l.role === 'required');
	const passing = short.filter((l) => l.runout!.coveredAgainH !== null);
	return {
		notes: [
			`The time course grows on ${carbonName} and holds biomass to what the required nutrients supply by each time; trace elements are followed by their demand per g of biomass.`,
			...lasting.map(
				({ name, runout }) =>
					`${name} runs out ${at(runout!.shortFromH)} and stays short: from there growth is held to what ${name} arrives, as the time course shows.`
			)
		],
		warnings: passing.map(({ name, runout, role }) => {
			const used = `${name} is used up ${at(runout!.shortFromH)} and covered again from about ${runout!.coveredAgainH!.toFixed(0)} h, when a feed brings more`;
			return role === 'required'
				? `${used}: growth is held in between (the time course shows it), so the run takes longer than on ${carbonName} alone.`
				: `${used}: growth would pause or slow in between, so the run may take longer than simulated.`;
		})
	};
}
