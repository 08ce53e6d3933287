import { AIR_O2_MOLE_FRACTION } from '../data/oxygen-solubility';
import { ChemistryInputError } from '../errors';
import { computeOxygenSaturation } from '../oxygen';
import { G_PER_L_PER_CELL_PER_ML_PER_PG } from '../sufficiency/read';
import { studyCautions } from './cautions';
import { StudyDataError, asStudyDataError } from './errors';
import { requireGrowthData, resolveOxygenYield } from './profile';
import type { OperatingPoint, ReportLog, StudyRun } from './report-context';
import {
	assessNutrients,
	describeRunouts,
	nameOf,
	reportFeeds,
	type NutrientSection
} from './report-nutrients';
import { assessHeat, assessOxygen, findOxygenLoad } from './report-oxygen';
import { REACHES_TARGET_FRACTION, assessTimeCourse } from './report-time-course';
import { simulatePlan } from './time-course';
import type { StudyInputs, StudyReport, WhatIf } from './types';
import { MAX_KLA_PER_H, computeVesselKLa } from './vessel';

/** Denser than this is packed cells, not a broth: the densest fed-batch cultures reach about 150 g/L (common practice). */
export const MAX_BIOMASS_G_PER_L = 200;
/**
 * Culture temperatures a study accepts, °C: inside the span of the oxygen solubility equation it uses
 * (Benson & Krause 1984, 0–50 °C as APHA 4500-O tabulates it; chemistry/REFERENCES.md).
 */
export const STUDY_TEMPERATURE_RANGE_C = [0, 40] as const;

/** A what-if value out of range: the request's fault (the app answers 400 at the field). */
function whatIfError(message: string, field: string): never {
	throw new ChemistryInputError(message, { field });
}

/** Cells/mL as g/L dry biomass at the profile's cell dry mass. */
export function convertCellsPerMlToGPerL(cellsPerMl: number, cellDryMassPg: number): number {
	return cellsPerMl * cellDryMassPg * G_PER_L_PER_CELL_PER_ML_PER_PG;
}

/** The target as g/L dry biomass (and cells/mL where the cell mass is known), within physical sense. */
export function convertTargetToBiomass(
	inputs: StudyInputs,
	targetValue: number
): { biomassGPerL: number; cellsPerMl: number | null } {
	const { plan, profile } = inputs;
	if (!(targetValue > 0) || !Number.isFinite(targetValue))
		whatIfError(`The target density must be greater than 0, not ${targetValue}.`, 'targetValue');
	if (plan.targetBasis === 'biomassGPerL') {
		const cellsPerMl = profile.cellDryMassPg
			? targetValue / (profile.cellDryMassPg * G_PER_L_PER_CELL_PER_ML_PER_PG)
			: null;
		if (targetValue > MAX_BIOMASS_G_PER_L) {
			whatIfError(
				`A target of ${targetValue} g/L dry biomass is beyond physical sense: above ${MAX_BIOMASS_G_PER_L} g/L the broth would be packed cells.`,
				'targetValue'
			);
		}
		return { biomassGPerL: targetValue, cellsPerMl };
	}
	if (profile.cellDryMassPg === null) {
		throw new StudyDataError(
			`A target in cells/mL needs the cell dry mass (pg/cell) on the profile “${profile.name}”.`,
			{ field: 'profile.cellDryMassPg' }
		);
	}
	const biomassGPerL = convertCellsPerMlToGPerL(targetValue, profile.cellDryMassPg);
	if (biomassGPerL > MAX_BIOMASS_G_PER_L) {
		whatIfError(
			`A target of ${targetValue.toExponential(2)} cells/mL is ${biomassGPerL.toPrecision(3)} g/L dry biomass at ${profile.cellDryMassPg} pg/cell: beyond physical sense (above ${MAX_BIOMASS_G_PER_L} g/L).`,
			'targetValue'
		);
	}
	return { biomassGPerL, cellsPerMl: targetValue };
}

/** The study's settings with the what-if applied, each checked and named by its field when out of range. */
export function readOperatingPoint(inputs: StudyInputs, whatIf: WhatIf): OperatingPoint {
	const { plan, vessel } = inputs;
	const targetValue = whatIf.targetValue ?? plan.targetValue;
	const target = convertTargetToBiomass(inputs, targetValue);
	const plannedFeedL = inputs.feeds.reduce((sum, f) => sum + f.volumeL, 0);
	const feedVolumeL = whatIf.feedVolumeL ?? plannedFeedL;
	if (!(feedVolumeL >= 0) || !Number.isFinite(feedVolumeL))
		whatIfError(`The feed volume must be 0 or more litres, not ${feedVolumeL}.`, 'feedVolumeL');
	if (feedVolumeL > 0 && inputs.feeds.length === 0)
		whatIfError(
			'This study has no feed to scale: add a feed recipe version to the study first.',
			'feedVolumeL'
		);
	const feedScale = plannedFeedL > 0 ? feedVolumeL / plannedFeedL : 0;
	const feeds = inputs.feeds.map((f) => ({ ...f, volumeL: f.volumeL * feedScale }));

	const vesselKLa = computeVesselKLa(vessel, plan.initialVolumeL, {
		agitationRpm: plan.plannedAgitationRpm,
		gasFlowLPerMin: plan.plannedGasFlowLPerMin
	});
	const kLaPerH = whatIf.kLaPerH ?? vesselKLa.kLaPerH;
	if (!(kLaPerH > 0) || kLaPerH > MAX_KLA_PER_H)
		whatIfError(`kLa must be above 0 and at most ${MAX_KLA_PER_H} 1/h, not ${kLaPerH}.`, 'kLaPerH');
	const o2MoleFraction = whatIf.o2MoleFraction ?? plan.o2MoleFraction;
	if (!(o2MoleFraction > 0) || o2MoleFraction > 1)
		whatIfError(
			`The O2 mole fraction must be above 0 and at most 1, not ${o2MoleFraction}.`,
			'o2MoleFraction'
		);
	const temperatureC = whatIf.temperatureC ?? plan.temperatureC;
	const [minC, maxC] = STUDY_TEMPERATURE_RANGE_C;
	if (!(temperatureC >= minC) || temperatureC > maxC)
		whatIfError(
			`The temperature must be between ${minC} and ${maxC} °C for the oxygen solubility equations, not ${temperatureC}.`,
			'temperatureC'
		);
	if (plan.pressureKPa > vessel.maxPressureKPa) {
		throw new ChemistryInputError(
			`The study's pressure ${plan.pressureKPa} kPa is above the vessel's rating of ${vessel.maxPressureKPa} kPa.`,
			{ field: 'pressureKPa' }
		);
	}
	const kLaOrigin = whatIf.kLaPerH === undefined ? vesselKLa.origin : 'from the what-if';
	return {
		targetValue,
		target,
		feedVolumeL,
		feeds,
		kLaPerH,
		kLaOrigin,
		kLaWarning: whatIf.kLaPerH === undefined ? vesselKLa.warning : null,
		o2MoleFraction,
		temperatureC
	};
}

/** Oxygen solubility, the oxygen yield and the plan's two runs (the demand run and the run in this vessel). */
export function runStudyPlan(inputs: StudyInputs, point: OperatingPoint, log: ReportLog): StudyRun {
	const { plan, profile } = inputs;
	const { temperatureC, o2MoleFraction } = point;
	const growth = requireGrowthData(profile);
	const carbonFormula = inputs.componentFormulas[growth.carbonSourceId] ?? null;
	const yieldXO2GPerG = resolveOxygenYield(profile, carbonFormula, log.defaults);
	const saturation = asStudyDataError(() =>
		computeOxygenSaturation({ temperatureC, pressureKPa: plan.pressureKPa, o2MoleFraction })
	);
	const airSaturation = asStudyDataError(() =>
		computeOxygenSaturation({
			temperatureC,
			pressureKPa: plan.pressureKPa,
			o2MoleFraction: AIR_O2_MOLE_FRACTION
		})
	);
	log.defaults.push({
		what: 'Oxygen solubility',
		value: `${saturation.mgPerL.toPrecision(3)} mg/L at ${temperatureC} °C`,
		source: 'Benson & Krause (1984) for fresh water (salinity 0), APHA pressure correction'
	});
	if (profile.maintenanceGPerGH === null)
		log.defaults.push({
			what: 'Maintenance on the carbon source',
			value: '0',
			source: 'Not entered on the profile'
		});

	const initialBiomassGPerL =
		plan.targetBasis === 'cellsPerMl'
			? convertCellsPerMlToGPerL(plan.inoculumDensity, profile.cellDryMassPg ?? 0)
			: plan.inoculumDensity;
	const courses = simulatePlan({
		inputs,
		feeds: point.feeds,
		growth,
		yieldXO2GPerG,
		kLaPerH: point.kLaPerH,
		saturationMgPerL: saturation.mgPerL,
		airSaturationMgPerL: airSaturation.mgPerL,
		initialBiomassGPerL,
		targetBiomassGPerL: point.target.biomassGPerL,
		reachesFraction: REACHES_TARGET_FRACTION,
		defaults: log.defaults
	});
	// The oxygen and heat load follow the plan as written (its demand); everything else, the time
	// course, the run-out times and what controlled feeds deliver, follows the plan in this vessel,
	// where oxygen may hold growth back. When transfer keeps up, the two runs are the same.
	const demandCourse = 'message' in courses.demand ? null : courses.demand;
	const simulated = 'message' in courses.vessel ? null : courses.vessel;
	return { growth, yieldXO2GPerG, initialBiomassGPerL, courses, demandCourse, simulated };
}

/** The working volume: the plan must start above the vessel's minimum and end below its maximum. */
export function assessVolume(
	inputs: StudyInputs,
	finalVolumeL: number,
	feedUsedL: number,
	log: ReportLog
): StudyReport['volume'] {
	const { plan, vessel } = inputs;
	const volumeOk =
		finalVolumeL <= vessel.maxWorkingVolumeL && plan.initialVolumeL >= vessel.minWorkingVolumeL;
	if (finalVolumeL > vessel.maxWorkingVolumeL)
		log.reasons.push(
			`Final volume ${finalVolumeL.toFixed(1)} L is above the vessel's maximum working volume of ${vessel.maxWorkingVolumeL} L.`
		);
	if (plan.initialVolumeL < vessel.minWorkingVolumeL)
		log.reasons.push(
			`Initial volume ${plan.initialVolumeL} L is below the vessel's minimum working volume of ${vessel.minWorkingVolumeL} L.`
		);
	return {
		check: volumeOk ? 'ok' : 'short',
		initialL: plan.initialVolumeL,
		feedL: feedUsedL,
		finalL: finalVolumeL,
		minL: vessel.minWorkingVolumeL,
		maxL: vessel.maxWorkingVolumeL
	};
}

function describeLimit(
	inputs: StudyInputs,
	point: OperatingPoint,
	{ limitLine }: NutrientSection
): StudyReport['limit'] {
	const { cellsPerMl } = point.target;
	return {
		key: limitLine.key,
		name: limitLine.name,
		basis: limitLine.basis,
		ratio: limitLine.ratio,
		maxBiomassGPerL: limitLine.maxBiomassGPerL,
		maxCellsPerMl:
			cellsPerMl === null || limitLine.maxBiomassGPerL === null
				? null
				: (cellsPerMl * limitLine.ratio) / inputs.plan.safetyFactor
	};
}

/**
 * The study report: nutrients, oxygen, heat, volume and the time course, from loaded data and the
 * what-if. Pure: the page and `POST /api/v1/studies/evaluate` both call this, so they agree. Bad
 * what-if values throw `ChemistryInputError` at their field; data of the study that cannot be used,
 * `StudyDataError`.
 */
export function evaluateStudy(inputs: StudyInputs, whatIf: WhatIf = {}): StudyReport {
	const { plan } = inputs;
	const log: ReportLog = { defaults: [], notes: [], reasons: [] };
	const point = readOperatingPoint(inputs, whatIf);
	if (inputs.vessel.kLaMode === 'map' && whatIf.kLaPerH === undefined)
		log.defaults.push({
			what: 'kLa',
			value: `${Number(point.kLaPerH.toPrecision(3))} 1/h`,
			source: point.kLaOrigin.replace(/^from /, 'From ')
		});
	const run = runStudyPlan(inputs, point, log);

	const nutrients = assessNutrients(inputs, point, run, log);
	const feeds = reportFeeds(point, run, nutrients.usedL, log);
	const runouts = describeRunouts(
		nutrients.lines,
		nameOf(inputs, run.growth.carbonSourceId, 'component')
	);
	log.notes.push(...runouts.notes);

	const load = findOxygenLoad(inputs, point, run, nutrients.finalVolumeL, log);
	const oxygen = assessOxygen(inputs, point, run, load, nutrients.finalVolumeL, log);
	const heat = assessHeat(inputs, run, load, log);
	const volume = assessVolume(inputs, nutrients.finalVolumeL, nutrients.feedUsedL, log);
	const timeCourse = assessTimeCourse(inputs, point, run, nutrients, log);
	log.notes.push(...nutrients.sufficiency.notes);

	return {
		verdict: log.reasons.length === 0 ? 'supported' : 'not supported',
		reasons: log.reasons,
		warnings: [
			...(point.kLaWarning ? [point.kLaWarning] : []),
			...nutrients.sufficiency.warnings,
			...runouts.warnings
		],
		inputs: {
			targetValue: point.targetValue,
			targetBasis: plan.targetBasis,
			targetBiomassGPerL: point.target.biomassGPerL,
			targetCellsPerMl: point.target.cellsPerMl,
			feedVolumeL: point.feedVolumeL,
			kLaPerH: point.kLaPerH,
			kLaOrigin: point.kLaOrigin,
			o2MoleFraction: point.o2MoleFraction,
			temperatureC: point.temperatureC,
			pressureKPa: plan.pressureKPa,
			doSetpointPercent: plan.doSetpointPercent,
			safetyFactor: plan.safetyFactor
		},
		limit: describeLimit(inputs, point, nutrients),
		nutrients: {
			check: nutrients.sufficiency.sufficient ? 'ok' : 'short',
			lines: nutrients.lines,
			notes: nutrients.sufficiency.notes
		},
		oxygen,
		heat,
		volume,
		feeds,
		timeCourse,
		defaults: log.defaults,
		notes: log.notes,
		cautions: studyCautions(point.o2MoleFraction)
	};
}
