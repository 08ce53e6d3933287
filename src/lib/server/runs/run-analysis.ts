// A run held against its plan: the study's time course, the run's data thinned for charts, the gas
// exchange from its off-gas, the flags and projection, and the growth values read back from it.
import {
	computeOxygenSaturation,
	computeRunGasExchange,
	comparePlan,
	learnFromRun,
	interpolateAt,
	type PlanComparison,
	type PlannedCourse,
	type RunGasExchange,
	type LearnedGrowth,
	type StudyReport,
	type TimeSeries
} from '$chemistry';
import type { RunSignal } from '$lib/runs/signals';
import { db } from '../db';
import { RuleError } from '../rule-error';
import { evaluateStudy } from '../studies/evaluate';
import { loadStudyInputs } from '../studies/queries';
import type { RunRow } from '../db/schema';
import { readChartSeries, readSeries, type RunSeries } from './series-read';

const AIR_O2_FRACTION = 0.20946;
const CHART_POINTS = 1200;

/** Seconds from the start to hours, for one stored series. */
function hoursOf(series: RunSeries, signal: RunSignal): TimeSeries | null {
	const s = series[signal];
	if (!s || s.timeS.length === 0) return null;
	return { timeH: s.timeS.map((t) => t / 3600), value: s.value };
}

/** Every n-th point so a chart gets about `max`; the calculations use all of them. */
function thin<T extends { timeH: number[] }>(series: T, keys: (keyof T)[], max = CHART_POINTS): T {
	const n = series.timeH.length;
	if (n <= max) return series;
	const step = Math.ceil(n / max);
	const keep = (i: number) => i % step === 0 || i === n - 1;
	const out = { ...series };
	for (const key of keys)
		(out[key] as unknown) = (series[key] as unknown as unknown[]).filter((_, i) => keep(i));
	return out;
}

export interface RunAnalysis {
	report: StudyReport | null;
	reportError: string | null;
	airSaturationMgPerL: number;
	plan: PlannedCourse | null;
	/** the run's signals, thinned for charts, in hours */
	chart: Partial<Record<RunSignal, TimeSeries>>;
	gas:
		| (Pick<RunGasExchange, 'skipped' | 'skippedCount'> & {
				timeH: number[];
				ourMmolPerLH: number[];
				cerMmolPerLH: number[];
				respiratoryQuotient: (number | null)[];
				inSituKLaPerH: (number | null)[];
				o2ConsumedMol: number;
				co2ProducedMol: number;
				latest: {
					timeH: number;
					our: number;
					cer: number;
					rq: number | null;
					kLa: number | null;
				} | null;
		  })
		| null;
	comparison: PlanComparison | null;
	learned: LearnedGrowth | null;
	/** the profile's values the learned ones are shown against */
	profileValues: {
		muMaxPerH: number | null;
		yieldXSGPerG: number | null;
		yieldXO2GPerG: number | null;
	};
	lastDataH: number | null;
}

export async function analyseRun(row: RunRow): Promise<RunAnalysis> {
	const { inputs } = loadStudyInputs(row.studyId);
	let report: StudyReport | null = null;
	let reportError: string | null = null;
	try {
		report = await evaluateStudy(inputs);
	} catch (cause) {
		if (!(cause instanceof RuleError)) throw cause;
		reportError = cause.message;
	}
	const plan = inputs.plan;
	const airSaturationMgPerL = computeOxygenSaturation({
		temperatureC: plan.temperatureC,
		pressureKPa: plan.pressureKPa,
		o2MoleFraction: AIR_O2_FRACTION
	}).mgPerL;

	const course = report && report.timeCourse.check !== 'unavailable' ? report.timeCourse : null;
	const planned: PlannedCourse | null = course
		? {
				timeH: course.t,
				biomassGPerL: course.biomassGPerL,
				substrateGPerL: course.substrateGPerL,
				dissolvedOxygenPercent: course.dissolvedOxygenMgPerL.map(
					(c) => (100 * c) / airSaturationMgPerL
				),
				ourMmolPerLH: course.ourMmolPerLH,
				volumeL: course.volumeL,
				maxOtrMmolPerLH: course.maxOtrMmolPerLH,
				oxygenLimitedFromH: course.oxygenLimitedH[0]?.fromH ?? null,
				targetBiomassGPerL: report!.inputs.targetBiomassGPerL
			}
		: null;

	const full = readSeries(row.id, [
		'dry_weight_g_per_l',
		'substrate_g_per_l',
		'do_percent',
		'gas_flow_l_per_min',
		'inlet_o2_percent',
		'inlet_co2_percent',
		'exhaust_o2_percent',
		'exhaust_co2_percent',
		'volume_l',
		'feed_volume_l'
	]);
	const volume = hoursOf(full, 'volume_l');
	const feedAdded = hoursOf(full, 'feed_volume_l');
	const plannedVolume = course ? { timeH: course.t, value: course.volumeL } : null;
	const volumeAtL = (t: number) =>
		(volume && interpolateAt(volume, t)) ??
		(feedAdded ? plan.initialVolumeL + (interpolateAt(feedAdded, t) ?? 0) : null) ??
		(plannedVolume && interpolateAt(plannedVolume, t)) ??
		plan.initialVolumeL;

	const gasFlow = hoursOf(full, 'gas_flow_l_per_min');
	const exhaustO2 = hoursOf(full, 'exhaust_o2_percent');
	const exhaustCo2 = hoursOf(full, 'exhaust_co2_percent');
	const exchange =
		gasFlow && exhaustO2 && exhaustCo2
			? computeRunGasExchange({
					gasFlowLPerMin: gasFlow,
					exhaustO2Percent: exhaustO2,
					exhaustCo2Percent: exhaustCo2,
					inletO2Percent: hoursOf(full, 'inlet_o2_percent'),
					inletCo2Percent: hoursOf(full, 'inlet_co2_percent'),
					volumeL: volume,
					volumeFallbackL: volumeAtL,
					referenceTemperatureC: row.gasReferenceTemperatureC,
					referencePressureKPa: row.gasReferencePressureKPa,
					dissolvedOxygenPercent: hoursOf(full, 'do_percent'),
					airSaturationMgPerL
				})
			: null;
	const ourSeries =
		exchange && exchange.timeH.length
			? { timeH: exchange.timeH, value: exchange.ourMmolPerLH }
			: null;
	const biomass = hoursOf(full, 'dry_weight_g_per_l');
	const substrate = hoursOf(full, 'substrate_g_per_l');
	const dissolved = hoursOf(full, 'do_percent');
	const comparison = planned
		? comparePlan(
				planned,
				{
					biomassGPerL: biomass,
					substrateGPerL: substrate,
					dissolvedOxygenPercent: dissolved,
					ourMmolPerLH: ourSeries
				},
				{
					growthMarginFraction: 0.2,
					oxygenLimitPercent: plan.doSetpointPercent,
					substrateDepletedGPerL: 0.1,
					oxygenHoldH: 0.25,
					earlyByH: 0.5
				}
			)
		: null;
	const feedSubstrateGPerL = (() => {
		const carbon = inputs.profile.carbonSourceId;
		const feed = inputs.feeds[0];
		if (!carbon || !feed) return null;
		return feed.composition.componentsGPerL[carbon] ?? null;
	})();
	const learned = biomass
		? learnFromRun({
				biomassGPerL: biomass,
				substrateGPerL: substrate,
				volumeAtL,
				feedAddedL: feedAdded,
				feedSubstrateGPerL,
				cumulativeO2Mol:
					exchange && exchange.timeH.length >= 2
						? { timeH: exchange.timeH, value: exchange.cumulativeO2Mol }
						: null
			})
		: null;

	const chartSeries = readChartSeries(row.id);
	const chart: RunAnalysis['chart'] = {};
	for (const signal of Object.keys(chartSeries) as RunSignal[]) {
		const s = hoursOf(chartSeries, signal);
		if (s) chart[signal] = s;
	}
	const lastDataH = Math.max(
		...Object.values(chart).map((s) => s.timeH[s.timeH.length - 1]),
		-Infinity
	);
	const n = exchange?.timeH.length ?? 0;
	return {
		report,
		reportError,
		airSaturationMgPerL,
		plan: planned,
		chart,
		gas:
			exchange && n
				? {
						...thin(
							{
								timeH: exchange.timeH,
								ourMmolPerLH: exchange.ourMmolPerLH,
								cerMmolPerLH: exchange.cerMmolPerLH,
								respiratoryQuotient: exchange.respiratoryQuotient,
								inSituKLaPerH: exchange.inSituKLaPerH
							},
							['timeH', 'ourMmolPerLH', 'cerMmolPerLH', 'respiratoryQuotient', 'inSituKLaPerH']
						),
						skipped: exchange.skipped,
						skippedCount: exchange.skippedCount,
						o2ConsumedMol: exchange.cumulativeO2Mol[n - 1],
						co2ProducedMol: exchange.cumulativeCo2Mol[n - 1],
						latest: {
							timeH: exchange.timeH[n - 1],
							our: exchange.ourMmolPerLH[n - 1],
							cer: exchange.cerMmolPerLH[n - 1],
							rq: exchange.respiratoryQuotient[n - 1],
							kLa: exchange.inSituKLaPerH[n - 1]
						}
					}
				: null,
		comparison,
		learned,
		profileValues: {
			muMaxPerH: inputs.profile.muMaxPerH,
			yieldXSGPerG: inputs.profile.yieldXSGPerG,
			yieldXO2GPerG: inputs.profile.yieldXO2GPerG
		},
		lastDataH: Number.isFinite(lastDataH) ? lastDataH : null
	};
}

/**
 * The analysis of a run whose data, plan and profile have not changed since it was last made: the
 * run page asks every few seconds while nothing new has arrived, and a 14-day run takes seconds to
 * analyse afresh (tests/bench/run-at-scale.scenario.ts).
 */
const recent = new Map<string, { key: string; analysis: Promise<RunAnalysis> }>();
const MAX_CACHED_RUNS = 20;

export function analyseRunOnChange(row: RunRow): Promise<RunAnalysis> {
	const client = db.$client;
	const state = client
		.prepare(
			`SELECT (SELECT count(*) || ':' || coalesce(max(created_at), 0) FROM run_upload WHERE run_id = ?) AS uploads,
			        (SELECT updated_at || ':' || revision FROM study WHERE id = ?) AS plan,
			        (SELECT revision FROM organism_profile WHERE id = ?) AS profile,
			        (SELECT revision FROM vessel WHERE id = ?) AS vessel`
		)
		.get(row.id, row.studyId, row.profileId, row.vesselId) as Record<string, string | number>;
	const key = `${row.revision}|${state.uploads}|${state.plan}|${state.profile}|${state.vessel}`;
	const cached = recent.get(row.id);
	if (cached && cached.key === key) return cached.analysis;
	const analysis = analyseRun(row);
	recent.delete(row.id);
	recent.set(row.id, { key, analysis });
	if (recent.size > MAX_CACHED_RUNS) recent.delete(recent.keys().next().value!);
	analysis.catch(() => recent.delete(row.id));
	return analysis;
}
