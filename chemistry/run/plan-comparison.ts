/**
 * A run held against its plan: where the measured biomass, DO and substrate part from the study's
 * time course by more than the margins that matter, and, from the latest data, when the run will
 * reach its target and the vessel's oxygen limit if it keeps growing as it does now.
 */
import { fitLine } from '../growth-fit/regression';
import { firstSustainedBelow, interpolateAt, type TimeSeries } from './series';

export interface PlannedCourse {
	timeH: number[];
	biomassGPerL: number[];
	substrateGPerL: number[];
	dissolvedOxygenPercent: number[];
	ourMmolPerLH: number[];
	volumeL: number[];
	/** kLa·C*: the most the vessel transfers, mmol/L/h; null when unknown */
	maxOtrMmolPerLH: number | null;
	/** when the plan first becomes oxygen-limited (DO at its floor), or null */
	oxygenLimitedFromH: number | null;
	targetBiomassGPerL: number;
}

export interface RunActual {
	biomassGPerL?: TimeSeries | null;
	substrateGPerL?: TimeSeries | null;
	dissolvedOxygenPercent?: TimeSeries | null;
	ourMmolPerLH?: TimeSeries | null;
}

export interface ComparisonSettings {
	/** growth ahead or behind the plan by more than this fraction is flagged; 0.2 by default (ours) */
	growthMarginFraction: number;
	/** DO below this, % of air saturation, counts as oxygen limitation (the study's DO setpoint) */
	oxygenLimitPercent: number;
	/** the carbon source counts as run out below this, g/L; 0.1 by default (ours: near the detection limit of common assays) */
	substrateDepletedGPerL: number;
	/** a DO dip must last this long to count, h; 0.25 by default (ours), so one noisy reading is not an event */
	oxygenHoldH: number;
	/** how much earlier than planned an event must be to be flagged, h; 0.5 by default (ours) */
	earlyByH: number;
}

export const DEFAULT_COMPARISON_SETTINGS: ComparisonSettings = {
	growthMarginFraction: 0.2,
	oxygenLimitPercent: 30,
	substrateDepletedGPerL: 0.1,
	oxygenHoldH: 0.25,
	earlyByH: 0.5
};

export type FlagKind = 'growthAhead' | 'growthBehind' | 'oxygenEarly' | 'substrateEarly';

export interface ComparisonFlag {
	kind: FlagKind;
	atH: number;
	message: string;
}

export interface RunProjection {
	/** the specific growth rate the projection runs on, 1/h */
	muPerH: number;
	/** what μ was read from */
	basis: string;
	fromH: number;
	/** when X reaches the target at this μ; null when it will not (μ ≤ 0) or already has */
	targetAtH: number | null;
	/** when OUR reaches the vessel's maximum OTR at this μ; null when unknown or not while growing */
	oxygenLimitAtH: number | null;
}

export interface PlanComparison {
	flags: ComparisonFlag[];
	/** measured X over planned X at the latest sample, or null without samples */
	latestGrowthRatio: number | null;
	projection: RunProjection | null;
}

const h = (x: number) => `${Number(x.toFixed(1))} h`;

function growthFlags(plan: PlannedCourse, biomass: TimeSeries, margin: number) {
	const flags: ComparisonFlag[] = [];
	let latestRatio: number | null = null;
	let latestH: number | null = null;
	const course = { timeH: plan.timeH, value: plan.biomassGPerL };
	const lastPlanH = plan.timeH[plan.timeH.length - 1];
	for (let i = 0; i < biomass.timeH.length; i++) {
		const t = biomass.timeH[i];
		if (t < 0 || t > lastPlanH) continue;
		const planned = interpolateAt(course, t);
		if (planned === null || !(planned > 0)) continue;
		latestRatio = biomass.value[i] / planned;
		latestH = t;
	}
	if (latestRatio !== null && latestH !== null) {
		const t = latestH;
		const percent = Math.round((latestRatio - 1) * 100);
		if (latestRatio > 1 + margin)
			flags.push({
				kind: 'growthAhead',
				atH: t,
				message: `Growth is ahead of the plan: X is ${percent} % above it at ${h(t)} (margin ±${Math.round(margin * 100)} %). Oxygen and nutrients will be needed sooner than planned.`
			});
		else if (latestRatio < 1 - margin)
			flags.push({
				kind: 'growthBehind',
				atH: t,
				message: `Growth is behind the plan: X is ${-percent} % below it at ${h(t)} (margin ±${Math.round(margin * 100)} %).`
			});
	}
	return { flags, latestRatio };
}

/** Planned carbon-source run-out: the first time the plan's substrate falls below the threshold. */
function plannedDepletionH(plan: PlannedCourse, threshold: number): number | null {
	const i = plan.substrateGPerL.findIndex((s) => s < threshold);
	return i < 0 ? null : plan.timeH[i];
}

/**
 * μ from the latest data: ln X over the last samples (at least 3 within the last 12 h) or, when
 * there are too few, ln OUR over the last 2 h (OUR rises with X in unlimited growth).
 */
interface GrowthNow {
	muPerH: number;
	basis: string;
	fromH: number;
	/** the latest X and when it was sampled */
	x: { value: number; atH: number } | null;
	/** the latest OUR and when it was logged: the oxygen limit is projected from its own time */
	our: { value: number; atH: number } | null;
}

const latest = (s: TimeSeries | null | undefined) =>
	s && s.value.length
		? { value: s.value[s.value.length - 1], atH: s.timeH[s.timeH.length - 1] }
		: null;

function currentGrowthRate(actual: RunActual): GrowthNow | null {
	const x = actual.biomassGPerL;
	const our = actual.ourMmolPerLH;
	const latestOur = latest(our);
	if (x && x.timeH.length >= 3) {
		const last = x.timeH[x.timeH.length - 1];
		const idx = x.timeH.map((t, i) => i).filter((i) => x.timeH[i] >= last - 12 && x.value[i] > 0);
		if (idx.length >= 3) {
			const fit = fitLine(
				idx.map((i) => x.timeH[i]),
				idx.map((i) => Math.log(x.value[i]))
			);
			return {
				muPerH: fit.slope,
				basis: `ln X over the last ${idx.length} samples`,
				fromH: last,
				x: latest(x),
				our: latestOur
			};
		}
	}
	if (our && our.timeH.length >= 5) {
		const last = our.timeH[our.timeH.length - 1];
		const idx = our.timeH
			.map((t, i) => i)
			.filter((i) => our.timeH[i] >= last - 2 && our.value[i] > 0);
		if (idx.length >= 5) {
			const fit = fitLine(
				idx.map((i) => our.timeH[i]),
				idx.map((i) => Math.log(our.value[i]))
			);
			return {
				muPerH: fit.slope,
				basis: `ln OUR over the last 2 h (${idx.length} points)`,
				fromH: last,
				x: latest(x),
				our: latestOur
			};
		}
	}
	return null;
}

export function projectRun(plan: PlannedCourse, actual: RunActual): RunProjection | null {
	const growth = currentGrowthRate(actual);
	if (!growth) return null;
	const { muPerH, fromH, x, our } = growth;
	const growing = muPerH > 1e-6;
	const targetAtH =
		growing && x !== null && x.value > 0 && x.value < plan.targetBiomassGPerL
			? x.atH + Math.log(plan.targetBiomassGPerL / x.value) / muPerH
			: null;
	const maxOtr = plan.maxOtrMmolPerLH;
	const oxygenLimitAtH =
		growing && our !== null && our.value > 0 && maxOtr !== null
			? our.value >= maxOtr
				? our.atH
				: our.atH + Math.log(maxOtr / our.value) / muPerH
			: null;
	return { muPerH, basis: growth.basis, fromH, targetAtH, oxygenLimitAtH };
}

export function comparePlan(
	plan: PlannedCourse,
	actual: RunActual,
	settings: ComparisonSettings = DEFAULT_COMPARISON_SETTINGS
): PlanComparison {
	const flags: ComparisonFlag[] = [];
	let latestGrowthRatio: number | null = null;
	if (actual.biomassGPerL?.timeH.length) {
		const growth = growthFlags(plan, actual.biomassGPerL, settings.growthMarginFraction);
		flags.push(...growth.flags);
		latestGrowthRatio = growth.latestRatio;
	}
	if (actual.dissolvedOxygenPercent?.timeH.length) {
		const actualH = firstSustainedBelow(
			actual.dissolvedOxygenPercent,
			settings.oxygenLimitPercent,
			settings.oxygenHoldH
		);
		const plannedH = plan.oxygenLimitedFromH;
		if (actualH !== null && (plannedH === null || actualH < plannedH - settings.earlyByH))
			flags.push({
				kind: 'oxygenEarly',
				atH: actualH,
				message: `DO fell below ${settings.oxygenLimitPercent} % at ${h(actualH)}, ${plannedH === null ? 'where the plan never becomes oxygen-limited' : `earlier than the plan's ${h(plannedH)}`}. Check agitation, gas flow and kLa before the demand rises further.`
			});
	}
	if (actual.substrateGPerL?.timeH.length) {
		const s = actual.substrateGPerL;
		const i = s.value.findIndex((v) => v < settings.substrateDepletedGPerL);
		const plannedH = plannedDepletionH(plan, settings.substrateDepletedGPerL);
		if (i >= 0 && (plannedH === null || s.timeH[i] < plannedH - settings.earlyByH))
			flags.push({
				kind: 'substrateEarly',
				atH: s.timeH[i],
				message: `The carbon source was below ${settings.substrateDepletedGPerL} g/L at ${h(s.timeH[i])}, ${plannedH === null ? 'where the plan never runs out' : `before the plan's ${h(plannedH)}`}.`
			});
	}
	return { flags, latestGrowthRatio, projection: projectRun(plan, actual) };
}
