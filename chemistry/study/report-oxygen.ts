import { AIR_O2_MOLE_FRACTION } from '../data/oxygen-solubility';
import { AIR_FRACTION_TOLERANCE, isOxygenEnriched } from './cautions';
import { DEFAULT_HEAT_PER_MOL_O2_KJ, DEFAULT_HEAT_PER_MOL_O2_SOURCE, assessCooling } from '../heat';
import {
	assessOxygenTransfer,
	computeOxygenDemand,
	computeOxygenUptakeRate,
	type OxygenTransferResult
} from '../oxygen';
import { findPeakOxygenLoad, roundUpToSignificant } from '../oxygen-load';
import { asStudyDataError } from './errors';
import { hours, type OperatingPoint, type ReportLog, type StudyRun } from './report-context';
import type { StudyInputs, StudyReport } from './types';

/** The O2 load the vessel must carry: the peak OUR and, for the heat, the peak of the whole culture's uptake OUR·V. */
export interface OxygenLoad {
	peakOurMmolPerLH: number;
	uptakeOurMmolPerLH: number;
	uptakeVolumeL: number;
	atH: number | null;
	peakOurOrigin: string;
	/** The figures could not cover the whole plan: the demand can only be higher. */
	lowerBound: boolean;
}

/**
 * The demand of the plan as written, up to the target: the question is whether the vessel carries the
 * culture there; growth the feeds would carry beyond it is noted, not required. Without a run, a rough
 * estimate μmax · X_target / Yx/O2 over the final volume, and never "supported".
 */
export function findOxygenLoad(
	inputs: StudyInputs,
	point: OperatingPoint,
	run: StudyRun,
	finalVolumeL: number,
	log: ReportLog
): OxygenLoad {
	const { demandCourse, courses, growth } = run;
	if (!demandCourse) {
		const estimate = asStudyDataError(
			() =>
				computeOxygenUptakeRate({
					specificGrowthRatePerH: growth.muMaxPerH,
					biomassGPerL: point.target.biomassGPerL,
					yieldBiomassOnOxygenGPerG: run.yieldXO2GPerG
				}).mmolPerLH
		);
		const peakOurOrigin =
			'μmax · X_target / Yx/O2, a rough estimate: the plan could not be simulated';
		log.defaults.push({
			what: 'Peak OUR',
			value: `${estimate.toPrecision(3)} mmol/(L·h)`,
			source: peakOurOrigin
		});
		log.reasons.push(
			`The plan cannot be simulated (${'message' in courses.demand ? courses.demand.message : 'no time course'}), so its oxygen and heat load are rough estimates and it cannot be called supported.`
		);
		return {
			peakOurMmolPerLH: estimate,
			uptakeOurMmolPerLH: estimate,
			uptakeVolumeL: finalVolumeL,
			atH: null,
			peakOurOrigin,
			lowerBound: true
		};
	}
	const untilH = demandCourse.targetReachedAtH ?? Infinity;
	const peak = findPeakOxygenLoad(demandCourse, untilH);
	const peakOurOrigin = `the O2 demand of the plan as written${demandCourse.targetReachedAtH === null ? '' : ' up to the target'}, at ${hours(peak.peakOurAtH)}: the growth the feeds support, not held back by this vessel's transfer`;
	const beyond = findPeakOxygenLoad(demandCourse);
	if (
		demandCourse.targetReachedAtH !== null &&
		beyond.peakOurMmolPerLH > 1.01 * peak.peakOurMmolPerLH
	) {
		log.notes.push(
			`The plan reaches the target at ${hours(demandCourse.targetReachedAtH)} and feeds on: run to its end, its O2 demand rises to ${beyond.peakOurMmolPerLH.toPrecision(3)} mmol/(L·h) at ${hours(beyond.peakOurAtH)}, beyond what the target needs.`
		);
	}
	const lowerBound = demandCourse.stoppedAtH !== null;
	if (demandCourse.stoppedAtH !== null) {
		log.reasons.push(
			`The plan fills the vessel at ${hours(demandCourse.stoppedAtH)}, before its end at ${hours(inputs.plan.durationH)}; the oxygen and heat figures cover the run only that far, so they are lower bounds.`
		);
	}
	return {
		peakOurMmolPerLH: peak.peakOurMmolPerLH,
		uptakeOurMmolPerLH: peak.peakUptakeOurMmolPerLH,
		uptakeVolumeL: peak.peakUptakeVolumeL,
		atH: peak.peakOurAtH,
		peakOurOrigin,
		lowerBound
	};
}

/** Oxygen: the demand of the plan as written against what the vessel transfers at the DO setpoint. */
export function assessOxygen(
	inputs: StudyInputs,
	point: OperatingPoint,
	run: StudyRun,
	load: OxygenLoad,
	finalVolumeL: number,
	log: ReportLog
): StudyReport['oxygen'] {
	const { plan, vessel } = inputs;
	const { o2MoleFraction, temperatureC, kLaPerH, target } = point;
	const transfer = asStudyDataError(() =>
		assessOxygenTransfer({
			conditions: { temperatureC, pressureKPa: plan.pressureKPa, o2MoleFraction },
			kLaPerH,
			setpoint: { percentAirSaturation: plan.doSetpointPercent },
			uptake: { ourMmolPerLH: load.peakOurMmolPerLH }
		})
	);
	// Rounded up, so that the figure typed back in as a what-if meets the demand.
	const kLaRecommendedPerH = roundUpToSignificant(transfer.kLaNeededPerH);
	const o2MoleFractionRecommended = roundUpToSignificant(transfer.o2MoleFractionNeeded);
	const biomassFormedG =
		target.biomassGPerL * finalVolumeL - run.initialBiomassGPerL * plan.initialVolumeL;
	const oxygenDemand = computeOxygenDemand({
		yieldBiomassOnOxygenGPerG: run.yieldXO2GPerG,
		biomassProducedGPerL: Math.max(0, biomassFormedG / finalVolumeL),
		workingVolumeL: finalVolumeL
	});
	const transferOk = reportTransferShortfall(
		inputs,
		transfer,
		load,
		kLaRecommendedPerH,
		o2MoleFractionRecommended,
		log
	);
	const operationOk = reportOxygenOperation(inputs, point, log);
	return {
		check: transferOk && operationOk ? 'ok' : 'short',
		totalO2G: oxygenDemand.totalG,
		totalO2Mol: oxygenDemand.totalMol,
		yieldXO2GPerG: run.yieldXO2GPerG,
		peakOurMmolPerLH: load.peakOurMmolPerLH,
		peakOurAtH: load.atH,
		peakOurOrigin: load.peakOurOrigin,
		lowerBound: load.lowerBound,
		maxOtrMmolPerLH: transfer.maxOtr.mmolPerLH,
		utilisation: transfer.utilisation,
		saturationMgPerL: transfer.saturation.mgPerL,
		setpointMgPerL: transfer.setpointMgPerL,
		kLaNeededPerH: transfer.kLaNeededPerH,
		kLaRecommendedPerH,
		o2MoleFractionNeeded: transfer.o2MoleFractionNeeded,
		o2MoleFractionRecommended,
		enrichmentFeasible: transfer.enrichmentFeasible,
		enrichmentAllowed: vessel.o2EnrichmentAllowed,
		reserveS: transfer.reserveS
	};
}

/**
 * Says what the vessel needs when its transfer falls short of the peak demand; true when the
 * transfer suffices for a demand followed to the end (not a lower bound).
 */
function reportTransferShortfall(
	{ vessel }: StudyInputs,
	transfer: OxygenTransferResult,
	load: OxygenLoad,
	kLaRecommendedPerH: number,
	o2MoleFractionRecommended: number,
	log: ReportLog
): boolean {
	if (transfer.verdict === 'sufficient') return !load.lowerBound;
	const remedy = !transfer.enrichmentFeasible
		? ' (even pure O2 would not close the gap at this kLa)'
		: vessel.o2EnrichmentAllowed
			? `, or an O2 fraction of ${o2MoleFractionRecommended}`
			: ' (this vessel does not allow O2 enrichment)';
	log.reasons.push(
		`Peak OUR ${load.peakOurMmolPerLH.toFixed(0)} mmol/(L·h) exceeds the maximum OTR ${transfer.maxOtr.mmolPerLH.toFixed(0)} mmol/(L·h) at the DO setpoint: the plan needs kLa ${kLaRecommendedPerH} 1/h${remedy}.`
	);
	return false;
}

/**
 * Checks what the plan asks of O2 besides transfer (DO-stat feeds below the setpoint, enrichment the
 * vessel does not allow) and notes air as the default inlet gas; false when something is refused.
 */
function reportOxygenOperation(
	{ plan, vessel }: StudyInputs,
	point: OperatingPoint,
	log: ReportLog
): boolean {
	const { o2MoleFraction } = point;
	let ok = true;
	for (const f of point.feeds) {
		if (f.plan.strategy === 'doStat' && f.plan.doSetpointPercent! < plan.doSetpointPercent) {
			ok = false;
			log.reasons.push(
				`${f.label} feeds on DO-stat down to ${f.plan.doSetpointPercent} % of air saturation, below the study's DO setpoint of ${plan.doSetpointPercent} %: the controller would hold DO there whatever the kLa. Raise the feed's DO setpoint to at least ${plan.doSetpointPercent} %.`
			);
		}
	}
	if (isOxygenEnriched(o2MoleFraction) && !vessel.o2EnrichmentAllowed) {
		ok = false;
		log.reasons.push(
			`The plan sparges ${(o2MoleFraction * 100).toFixed(0)} % O2, but the vessel “${vessel.name}” does not allow O2 enrichment.`
		);
	}
	if (
		o2MoleFraction === plan.o2MoleFraction &&
		Math.abs(o2MoleFraction - AIR_O2_MOLE_FRACTION) < AIR_FRACTION_TOLERANCE
	) {
		log.defaults.push({
			what: 'Inlet gas',
			value: `air, O2 mole fraction ${AIR_O2_MOLE_FRACTION}`,
			source: 'Dry air'
		});
	}
	return ok;
}

/** Heat: metabolic heat at the peak of the whole culture's uptake, OUR·V, plus the agitator, against the cooling. */
export function assessHeat(
	inputs: StudyInputs,
	run: StudyRun,
	load: OxygenLoad,
	log: ReportLog
): StudyReport['heat'] {
	const { plan, vessel } = inputs;
	const heatPerMolO2KJ = plan.heatPerMolO2KJ ?? DEFAULT_HEAT_PER_MOL_O2_KJ;
	const agitationPowerW = vessel.agitationPowerW ?? 0;
	if (vessel.agitationPowerW === null)
		log.defaults.push({
			what: 'Agitation power added to the heat load',
			value: '0 W',
			source: 'Not entered for the vessel'
		});
	const cooling = assessCooling({
		ourMmolPerLH: load.uptakeOurMmolPerLH,
		workingVolumeL: load.uptakeVolumeL,
		heatPerMolO2KJ,
		coolingCapacityW: vessel.coolingCapacityW,
		agitationPowerW
	});
	if (plan.heatPerMolO2KJ === null) {
		log.defaults.push({
			what: 'Heat per mol O2 consumed',
			value: `${DEFAULT_HEAT_PER_MOL_O2_KJ} kJ/mol`,
			source: DEFAULT_HEAT_PER_MOL_O2_SOURCE
		});
	}
	log.defaults.push({
		what: 'Heat load taken at',
		value: run.demandCourse
			? `the peak of OUR × volume, ${load.uptakeOurMmolPerLH.toPrecision(3)} mmol/(L·h) in ${load.uptakeVolumeL.toPrecision(3)} L`
			: 'the estimated peak OUR over the final volume',
		source:
			'Metabolic heat in proportion to the O2 consumed (Cooney, Wang & Mateles 1969), plus the agitator power'
	});
	if (cooling.verdict !== 'sufficient')
		log.reasons.push(
			`Heat load ${cooling.heatLoadW.toFixed(0)} W exceeds the cooling capacity of ${vessel.coolingCapacityW} W.`
		);
	return {
		check: cooling.verdict === 'sufficient' && !load.lowerBound ? 'ok' : 'short',
		heatLoadW: cooling.heatLoadW,
		heatPerMolO2KJ,
		lowerBound: load.lowerBound,
		metabolicW: cooling.totalW,
		agitationPowerW,
		coolingCapacityW: vessel.coolingCapacityW,
		utilisation: cooling.utilisation
	};
}
