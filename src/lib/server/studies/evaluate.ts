import {
	AIR_O2_MOLE_FRACTION,
	DEFAULT_ELEMENT_ROLES_BASIS,
	DEFAULT_HEAT_PER_MOL_O2_KJ,
	DEFAULT_HEAT_PER_MOL_O2_SOURCE,
	DEFAULT_IGNORED_ELEMENTS,
	O2_MOLAR_MASS_G_PER_MOL,
	assessCooling,
	assessOxygenTransfer,
	assessSufficiency,
	computeOxygenDemand,
	computeOxygenSaturation,
	findPeakOxygenLoad,
	roundUpToSignificant,
	type SufficiencyResult
} from '$chemistry';
import { RuleError, withRuleErrors } from '../rule-error';
import { listYieldsUsed, requireGrowthData, resolveOxygenYield, toSufficiencyProfile } from './profiles';
import { findEmptyTime, findRunoutTimes } from './nutrient-runout';
import { isControlled, simulatePlan } from './time-course';
import { computeVesselKLa } from './vessels';
import type { DefaultUsed, FeedReport, NutrientRow, StudyInputs, StudyReport, WhatIf } from './types';

/** Denser than this is packed cells, not a broth: the densest fed-batch cultures reach about 150 g/L (common practice). */
export const MAX_BIOMASS_G_PER_L = 200;
const REACHES_TARGET_FRACTION = 0.98;
const G_PER_L_PER_CELL_PER_ML_PER_PG = 1e-9;

export const STUDY_CAUTIONS = [
	'Oxygen-enriched gas raises the risk of fire: keep ignition sources and oils away, and use only equipment rated for the O2 fraction.',
	"Stay within the vessel's pressure rating; do not raise headspace pressure beyond it to gain oxygen transfer.",
	'These results are estimates from models and typical values, not measurements.',
	"The site's procedures and qualified engineers decide whether and how a run goes ahead."
];

function whatIfError(message: string, field: string): never {
	throw new RuleError(message, { field });
}

function targetBiomass(inputs: StudyInputs, targetValue: number): { biomassGPerL: number; cellsPerMl: number | null } {
	const { plan, profile } = inputs;
	if (!(targetValue > 0) || !Number.isFinite(targetValue)) whatIfError(`The target density must be greater than 0, not ${targetValue}.`, 'targetValue');
	if (plan.targetBasis === 'biomassGPerL') {
		const cellsPerMl = profile.cellDryMassPg ? targetValue / (profile.cellDryMassPg * G_PER_L_PER_CELL_PER_ML_PER_PG) : null;
		if (targetValue > MAX_BIOMASS_G_PER_L) {
			whatIfError(`A target of ${targetValue} g/L dry biomass is beyond physical sense: above ${MAX_BIOMASS_G_PER_L} g/L the broth would be packed cells.`, 'targetValue');
		}
		return { biomassGPerL: targetValue, cellsPerMl };
	}
	if (profile.cellDryMassPg === null) {
		throw new RuleError(`A target in cells/mL needs the cell dry mass (pg/cell) on the profile “${profile.name}”.`, { field: 'profile.cellDryMassPg', status: 422 });
	}
	const biomassGPerL = targetValue * profile.cellDryMassPg * G_PER_L_PER_CELL_PER_ML_PER_PG;
	if (biomassGPerL > MAX_BIOMASS_G_PER_L) {
		whatIfError(
			`A target of ${targetValue.toExponential(2)} cells/mL is ${biomassGPerL.toPrecision(3)} g/L dry biomass at ${profile.cellDryMassPg} pg/cell: beyond physical sense (above ${MAX_BIOMASS_G_PER_L} g/L).`,
			'targetValue'
		);
	}
	return { biomassGPerL, cellsPerMl: targetValue };
}

/**
 * What the run-out times mean for a real run. A lasting shortfall is already a reason (its ratio is
 * below 1); one the feeds make good later is a warning: the totals hold, but growth would pause or
 * slow in between, which the time course (growing on the carbon source alone) does not show.
 */
function describeRunouts(lines: NutrientRow[], carbonName: string): { notes: string[]; warnings: string[] } {
	const short = lines.filter((l) => l.runout !== null).sort((a, b) => a.runout!.shortFromH - b.runout!.shortFromH);
	if (short.length === 0) return { notes: [], warnings: [] };
	// A trace element that stays short already has its warning, and does not stop growth.
	const lasting = short.filter((l) => l.runout!.coveredAgainH === null && l.role === 'required');
	const passing = short.filter((l) => l.runout!.coveredAgainH !== null);
	return {
		notes: [
			`The time course grows on ${carbonName} alone; the other nutrients are followed by their demand per g of biomass.`,
			...lasting.map(({ name, runout }) => `${name} runs out at about ${runout!.shortFromH.toFixed(0)} h and stays short: a real run would stop growing there.`)
		],
		warnings: passing.map(
			({ name, runout }) =>
				`${name} is used up at about ${runout!.shortFromH.toFixed(0)} h and covered again from about ${runout!.coveredAgainH!.toFixed(0)} h, when a feed brings more: growth would pause or slow in between, so the run may take longer than simulated.`
		)
	};
}

function withoutDeliveries<T extends { deliveries: unknown }>(course: T): Omit<T, 'deliveries'> {
	const { deliveries: _deliveries, ...rest } = course;
	return rest;
}

/** Hours as a report shows them. */
const hours = (h: number) => `${h.toFixed(h < 10 ? 1 : 0)} h`;

/** Science input errors inside a study are 422s: the study's own data, not the request, is at fault. */
const asSufficiencyError = <T>(run: () => T): T => withRuleErrors(run, { status: 422 });

/**
 * The study report: nutrients, oxygen, heat, volume and the time course, from loaded data and the
 * what-if. Pure: the page and `POST /api/v1/studies/evaluate` both call this, so they agree.
 */
export function evaluateStudy(inputs: StudyInputs, whatIf: WhatIf = {}): StudyReport {
	const { plan, profile, vessel } = inputs;
	const defaults: DefaultUsed[] = [];
	const notes: string[] = [];
	const reasons: string[] = [];

	const targetValue = whatIf.targetValue ?? plan.targetValue;
	const target = targetBiomass(inputs, targetValue);
	const plannedFeedL = inputs.feeds.reduce((sum, f) => sum + f.volumeL, 0);
	const feedVolumeL = whatIf.feedVolumeL ?? plannedFeedL;
	if (!(feedVolumeL >= 0) || !Number.isFinite(feedVolumeL)) whatIfError(`The feed volume must be 0 or more litres, not ${feedVolumeL}.`, 'feedVolumeL');
	if (feedVolumeL > 0 && inputs.feeds.length === 0) whatIfError('This study has no feed to scale: add a feed recipe version to the study first.', 'feedVolumeL');
	const feedScale = plannedFeedL > 0 ? feedVolumeL / plannedFeedL : 0;
	const feeds = inputs.feeds.map((f) => ({ ...f, volumeL: f.volumeL * feedScale }));

	const vesselKLa = computeVesselKLa(vessel);
	const kLaPerH = whatIf.kLaPerH ?? vesselKLa.kLaPerH;
	if (!(kLaPerH > 0) || kLaPerH > 3600) whatIfError(`kLa must be above 0 and at most 3600 1/h, not ${kLaPerH}.`, 'kLaPerH');
	const o2MoleFraction = whatIf.o2MoleFraction ?? plan.o2MoleFraction;
	if (!(o2MoleFraction > 0) || o2MoleFraction > 1) whatIfError(`The O2 mole fraction must be above 0 and at most 1, not ${o2MoleFraction}.`, 'o2MoleFraction');
	const temperatureC = whatIf.temperatureC ?? plan.temperatureC;
	if (!(temperatureC >= 0) || temperatureC > 40) whatIfError(`The temperature must be between 0 and 40 °C for the oxygen solubility equations, not ${temperatureC}.`, 'temperatureC');
	if (plan.pressureKPa > vessel.maxPressureKPa) {
		throw new RuleError(`The study's pressure ${plan.pressureKPa} kPa is above the vessel's rating of ${vessel.maxPressureKPa} kPa.`, { field: 'pressureKPa' });
	}

	// Oxygen and the time course
	const growth = requireGrowthData(profile);
	const carbonFormula = inputs.componentFormulas[growth.carbonSourceId] ?? null;
	const yieldXO2GPerG = resolveOxygenYield(profile, carbonFormula, defaults);
	const saturation = asSufficiencyError(() => computeOxygenSaturation({ temperatureC, pressureKPa: plan.pressureKPa, o2MoleFraction }));
	const airSaturation = asSufficiencyError(() => computeOxygenSaturation({ temperatureC, pressureKPa: plan.pressureKPa, o2MoleFraction: AIR_O2_MOLE_FRACTION }));
	defaults.push({ what: 'Oxygen solubility', value: `${saturation.mgPerL.toPrecision(3)} mg/L at ${temperatureC} °C`, source: 'Benson & Krause (1984) for fresh water (salinity 0), APHA pressure correction' });
	if (profile.maintenanceGPerGH === null) defaults.push({ what: 'Maintenance on the carbon source', value: '0', source: 'Not entered on the profile' });

	const initialBiomassGPerL =
		plan.targetBasis === 'cellsPerMl' ? plan.inoculumDensity * (profile.cellDryMassPg ?? 0) * G_PER_L_PER_CELL_PER_ML_PER_PG : plan.inoculumDensity;
	const courses = simulatePlan({
		inputs,
		feeds,
		growth,
		yieldXO2GPerG,
		kLaPerH,
		saturationMgPerL: saturation.mgPerL,
		airSaturationMgPerL: airSaturation.mgPerL,
		initialBiomassGPerL,
		targetBiomassGPerL: target.biomassGPerL,
		reachesFraction: REACHES_TARGET_FRACTION,
		defaults
	});
	// The oxygen and heat load follow the plan as written (its demand); everything else, the time
	// course, the run-out times and what controlled feeds deliver, follows the plan in this vessel,
	// where oxygen may hold growth back. When transfer keeps up, the two runs are the same.
	const demandCourse = 'message' in courses.demand ? null : courses.demand;
	const simulated = 'message' in courses.vessel ? null : courses.vessel;

	// Nutrients
	const { profile: sufficiencyProfile, carbon, substrates } = toSufficiencyProfile(profile);
	defaults.push(...listYieldsUsed(profile, inputs));
	// A controlled feed supplies what the run drew from it, at most what is available.
	const usedL = feeds.map((f, k) => (isControlled(f) && simulated ? Math.min(simulated.deliveries[k].deliveredL, f.volumeL) : f.volumeL));
	const feedUsedL = usedL.reduce((a, b) => a + b, 0);
	const finalVolumeL = plan.initialVolumeL + feedUsedL;
	const sufficiency: SufficiencyResult = asSufficiencyError(() =>
		assessSufficiency({
			profile: sufficiencyProfile,
			target: { biomassGPerL: target.biomassGPerL },
			supply: {
				finalVolumeL,
				sources: [
					{ name: inputs.basal.label, volumeL: plan.initialVolumeL, ...inputs.basal.composition },
					...feeds.flatMap((f, k) => (usedL[k] > 0 ? [{ name: f.label, volumeL: usedL[k], ...f.composition }] : []))
				]
			},
			safetyFactor: plan.safetyFactor,
			carbon,
			substrates
		})
	);
	if (plan.safetyFactor === 1.2) defaults.push({ what: 'Safety factor', value: '1.2', source: 'Common practice (the study keeps the suggested value)' });
	if (profile.kind === 'elementalFractions') {
		defaults.push({ what: 'Elements not assessed', value: DEFAULT_IGNORED_ELEMENTS.join(', '), source: 'Cells take H and O from water and O2, not from dissolved salts' });
	}
	if (profile.elementalFractions && profile.fractionsSource) {
		defaults.push({ what: 'Elemental mass fractions', value: 'from the profile', source: profile.fractionsSource });
	}
	const ownRoles = sufficiency.lines.filter((l) => l.roleFrom === 'profile').map((l) => `${l.key} ${l.role}`);
	if (sufficiency.lines.some((l) => l.basis === 'element' && l.roleFrom === 'default')) {
		defaults.push({ what: 'Roles of the elements (required or trace)', value: ownRoles.length ? `default, except ${ownRoles.join(', ')} (the profile's)` : 'default', source: DEFAULT_ELEMENT_ROLES_BASIS });
	}
	const nameOf = (key: string, basis: 'element' | 'component') => (basis === 'element' ? key : (inputs.componentNames[key] ?? key));
	const runouts = simulated
		? findRunoutTimes({ lines: sufficiency.lines, targetBiomassGPerL: target.biomassGPerL, basal: inputs.basal, initialVolumeL: plan.initialVolumeL, feeds, availableL: feeds.map((f) => f.volumeL), course: simulated })
		: sufficiency.lines.map(() => null);
	const lines = sufficiency.lines.map((l, i) => ({
		...l,
		name: nameOf(l.key, l.basis),
		// The model follows the carbon source itself: its exhaustion is an event of the time course.
		runout: l.basis === 'component' && l.key === growth.carbonSourceId ? null : runouts[i]
	}));
	// Only required nutrients limit; a short trace element is among the warnings.
	const limitLine = lines.find((l) => l.key === sufficiency.limiting!.key && l.basis === sufficiency.limiting!.basis)!;
	const nutrientsOk = sufficiency.sufficient;
	if (!nutrientsOk) {
		const short = lines.filter((l) => l.role === 'required' && !l.sufficient).map((l) => l.name);
		reasons.push(
			`${short.join(', ')} ${short.length === 1 ? 'runs' : 'run'} short of ${plan.safetyFactor} × demand; ${limitLine.name} limits first, at about ${limitLine.maxBiomassGPerL?.toPrecision(3)} g/L.`
		);
	}

	const feedReports: FeedReport[] = feeds.map((f, k) => {
		const controlled = isControlled(f);
		const delivery = simulated?.deliveries[k] ?? null;
		const emptyAtH = controlled && simulated && delivery ? findEmptyTime(simulated.t, delivery.cumulativeL, f.volumeL) : null;
		return { label: f.label, versionId: f.versionId, strategy: f.plan.strategy, startH: f.plan.startH, controlled, volumeL: f.volumeL, deliveredL: delivery?.deliveredL ?? null, usedL: usedL[k], emptyAtH };
	});
	for (const f of feedReports) {
		if (f.emptyAtH !== null) {
			reasons.push(`${f.label} runs dry at about ${f.emptyAtH.toFixed(0)} h: its plan would draw ${f.deliveredL!.toPrecision(3)} L, but ${f.volumeL} L are available.`);
		}
	}
	const { notes: runoutNotes, warnings: runoutWarnings } = describeRunouts(lines, nameOf(growth.carbonSourceId, 'component'));
	notes.push(...runoutNotes);
	const warnings = [...sufficiency.warnings, ...runoutWarnings];

	// Oxygen: the demand of the plan as written against what the vessel transfers at the DO setpoint.
	const heatPerMolO2KJ = plan.heatPerMolO2KJ ?? DEFAULT_HEAT_PER_MOL_O2_KJ;
	let load: { peakOurMmolPerLH: number; uptakeOurMmolPerLH: number; uptakeVolumeL: number; atH: number | null };
	let peakOurOrigin: string;
	/** The figures could not cover the whole plan: the demand can only be higher. */
	let lowerBound = false;
	if (!demandCourse) {
		const estimate = ((growth.muMaxPerH / yieldXO2GPerG) * target.biomassGPerL * 1000) / O2_MOLAR_MASS_G_PER_MOL;
		load = { peakOurMmolPerLH: estimate, uptakeOurMmolPerLH: estimate, uptakeVolumeL: finalVolumeL, atH: null };
		peakOurOrigin = 'μmax · X_target / Yx/O2, a rough estimate: the plan could not be simulated';
		lowerBound = true;
		defaults.push({ what: 'Peak OUR', value: `${estimate.toPrecision(3)} mmol/(L·h)`, source: peakOurOrigin });
		reasons.push(`The plan cannot be simulated (${'message' in courses.demand ? courses.demand.message : 'no time course'}), so its oxygen and heat load are rough estimates and it cannot be called supported.`);
	} else {
		// Up to the target: the question is whether the vessel carries the culture there. Growth the
		// feeds would carry beyond it is noted, not required.
		const untilH = demandCourse.targetReachedAtH ?? Infinity;
		const peak = findPeakOxygenLoad(demandCourse, untilH);
		load = { peakOurMmolPerLH: peak.peakOurMmolPerLH, uptakeOurMmolPerLH: peak.peakUptakeOurMmolPerLH, uptakeVolumeL: peak.peakUptakeVolumeL, atH: peak.peakOurAtH };
		peakOurOrigin = `the O2 demand of the plan as written${demandCourse.targetReachedAtH === null ? '' : ' up to the target'}, at ${hours(peak.peakOurAtH)}: the growth the feeds support, not held back by this vessel's transfer`;
		const beyond = findPeakOxygenLoad(demandCourse);
		if (demandCourse.targetReachedAtH !== null && beyond.peakOurMmolPerLH > 1.01 * peak.peakOurMmolPerLH) {
			notes.push(
				`The plan reaches the target at ${hours(demandCourse.targetReachedAtH)} and feeds on: run to its end, its O2 demand rises to ${beyond.peakOurMmolPerLH.toPrecision(3)} mmol/(L·h) at ${hours(beyond.peakOurAtH)}, beyond what the target needs.`
			);
		}
		if (demandCourse.stoppedAtH !== null) {
			lowerBound = true;
			reasons.push(
				`The plan fills the vessel at ${hours(demandCourse.stoppedAtH)}, before its end at ${hours(plan.durationH)}; the oxygen and heat figures cover the run only that far, so they are lower bounds.`
			);
		}
	}
	const transfer = asSufficiencyError(() =>
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
	const enriched = o2MoleFraction > AIR_O2_MOLE_FRACTION + 1e-4;
	const biomassFormedG = target.biomassGPerL * finalVolumeL - initialBiomassGPerL * plan.initialVolumeL;
	const oxygenDemand = computeOxygenDemand({
		yieldBiomassOnOxygenGPerG: yieldXO2GPerG,
		biomassProducedGPerL: Math.max(0, biomassFormedG / finalVolumeL),
		workingVolumeL: finalVolumeL
	});
	let oxygenOk = transfer.verdict === 'sufficient' && !lowerBound;
	if (transfer.verdict !== 'sufficient') {
		const remedy = !transfer.enrichmentFeasible
			? ' (even pure O2 would not close the gap at this kLa)'
			: vessel.o2EnrichmentAllowed
				? `, or an O2 fraction of ${o2MoleFractionRecommended}`
				: ' (this vessel does not allow O2 enrichment)';
		reasons.push(
			`Peak OUR ${load.peakOurMmolPerLH.toFixed(0)} mmol/(L·h) exceeds the maximum OTR ${transfer.maxOtr.mmolPerLH.toFixed(0)} mmol/(L·h) at the DO setpoint: the plan needs kLa ${kLaRecommendedPerH} 1/h${remedy}.`
		);
	}
	for (const f of feeds) {
		if (f.plan.strategy === 'doStat' && f.plan.doSetpointPercent! < plan.doSetpointPercent) {
			oxygenOk = false;
			reasons.push(
				`${f.label} feeds on DO-stat down to ${f.plan.doSetpointPercent} % of air saturation, below the study's DO setpoint of ${plan.doSetpointPercent} %: the controller would hold DO there whatever the kLa. Raise the feed's DO setpoint to at least ${plan.doSetpointPercent} %.`
			);
		}
	}
	if (enriched && !vessel.o2EnrichmentAllowed) {
		oxygenOk = false;
		reasons.push(`The plan sparges ${(o2MoleFraction * 100).toFixed(0)} % O2, but the vessel “${vessel.name}” does not allow O2 enrichment.`);
	}
	if (o2MoleFraction === plan.o2MoleFraction && Math.abs(o2MoleFraction - AIR_O2_MOLE_FRACTION) < 1e-4) {
		defaults.push({ what: 'Inlet gas', value: `air, O2 mole fraction ${AIR_O2_MOLE_FRACTION}`, source: 'Dry air' });
	}

	// Heat: at the peak of the whole culture's uptake, OUR·V
	const agitationPowerW = vessel.agitationPowerW ?? 0;
	if (vessel.agitationPowerW === null) defaults.push({ what: 'Agitation power added to the heat load', value: '0 W', source: 'Not entered for the vessel' });
	const cooling = assessCooling({
		ourMmolPerLH: load.uptakeOurMmolPerLH,
		workingVolumeL: load.uptakeVolumeL,
		heatPerMolO2KJ,
		coolingCapacityW: vessel.coolingCapacityW,
		agitationPowerW
	});
	if (plan.heatPerMolO2KJ === null) {
		defaults.push({ what: 'Heat per mol O2 consumed', value: `${DEFAULT_HEAT_PER_MOL_O2_KJ} kJ/mol`, source: DEFAULT_HEAT_PER_MOL_O2_SOURCE });
	}
	defaults.push({
		what: 'Heat load taken at',
		value: demandCourse ? `the peak of OUR × volume, ${load.uptakeOurMmolPerLH.toPrecision(3)} mmol/(L·h) in ${load.uptakeVolumeL.toPrecision(3)} L` : 'the estimated peak OUR over the final volume',
		source: 'Metabolic heat in proportion to the O2 consumed (Cooney, Wang & Mateles 1969), plus the agitator power'
	});
	const heatOk = cooling.verdict === 'sufficient' && !lowerBound;
	if (cooling.verdict !== 'sufficient') reasons.push(`Heat load ${cooling.heatLoadW.toFixed(0)} W exceeds the cooling capacity of ${vessel.coolingCapacityW} W.`);

	// Volume
	const volumeOk = finalVolumeL <= vessel.maxWorkingVolumeL && plan.initialVolumeL >= vessel.minWorkingVolumeL;
	if (finalVolumeL > vessel.maxWorkingVolumeL) reasons.push(`Final volume ${finalVolumeL.toFixed(1)} L is above the vessel's maximum working volume of ${vessel.maxWorkingVolumeL} L.`);
	if (plan.initialVolumeL < vessel.minWorkingVolumeL) reasons.push(`Initial volume ${plan.initialVolumeL} L is below the vessel's minimum working volume of ${vessel.minWorkingVolumeL} L.`);

	if (demandCourse && !demandCourse.reachesTarget) {
		reasons.push(
			`The plan as written reaches ${demandCourse.finalBiomassGPerL.toPrecision(3)} g/L${demandCourse.stoppedAtH !== null ? ` and stops at ${hours(demandCourse.stoppedAtH)}` : ''}, short of the target ${target.biomassGPerL.toPrecision(3)} g/L within ${plan.durationH} h.`
		);
	} else if (simulated && !simulated.reachesTarget) {
		const limited = simulated.oxygenLimitedH[0];
		reasons.push(
			`In this vessel the run reaches ${simulated.finalBiomassGPerL.toPrecision(3)} g/L, short of the target ${target.biomassGPerL.toPrecision(3)} g/L within ${plan.durationH} h${limited ? `: DO reaches 0 at ${hours(limited.fromH)} and oxygen transfer then sets the pace of growth` : ''}.`
		);
	}
	if (simulated && simulated.oxygenLimitedH.length > 0 && simulated.reachesTarget) {
		notes.push(`In this vessel DO reaches 0 at ${hours(simulated.oxygenLimitedH[0].fromH)}; growth then runs at what oxygen transfer supplies.`);
	}
	if ('message' in courses.vessel) notes.push(`Time course not available: ${courses.vessel.message}`);
	notes.push(...sufficiency.notes);

	return {
		verdict: reasons.length === 0 ? 'supported' : 'not supported',
		reasons,
		warnings,
		inputs: {
			targetValue,
			targetBasis: plan.targetBasis,
			targetBiomassGPerL: target.biomassGPerL,
			targetCellsPerMl: target.cellsPerMl,
			feedVolumeL,
			kLaPerH,
			kLaOrigin: whatIf.kLaPerH === undefined ? vesselKLa.origin : 'from the what-if',
			o2MoleFraction,
			temperatureC,
			pressureKPa: plan.pressureKPa,
			doSetpointPercent: plan.doSetpointPercent,
			safetyFactor: plan.safetyFactor
		},
		limit: {
			key: limitLine.key,
			name: limitLine.name,
			basis: limitLine.basis,
			ratio: limitLine.ratio,
			maxBiomassGPerL: limitLine.maxBiomassGPerL,
			maxCellsPerMl: target.cellsPerMl === null || limitLine.maxBiomassGPerL === null ? null : (target.cellsPerMl * limitLine.ratio) / plan.safetyFactor
		},
		nutrients: { check: nutrientsOk ? 'ok' : 'short', lines, notes: sufficiency.notes },
		oxygen: {
			check: oxygenOk ? 'ok' : 'short',
			totalO2G: oxygenDemand.totalG,
			totalO2Mol: oxygenDemand.totalMol,
			yieldXO2GPerG,
			peakOurMmolPerLH: load.peakOurMmolPerLH,
			peakOurAtH: load.atH,
			peakOurOrigin,
			lowerBound,
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
		},
		heat: {
			check: heatOk ? 'ok' : 'short',
			heatLoadW: cooling.heatLoadW,
			heatPerMolO2KJ,
			lowerBound,
			metabolicW: cooling.totalW,
			agitationPowerW,
			coolingCapacityW: vessel.coolingCapacityW,
			utilisation: cooling.utilisation
		},
		volume: { check: volumeOk ? 'ok' : 'short', initialL: plan.initialVolumeL, feedL: feedUsedL, finalL: finalVolumeL, minL: vessel.minWorkingVolumeL, maxL: vessel.maxWorkingVolumeL },
		feeds: feedReports,
		timeCourse: !simulated
			? { check: 'unavailable', message: 'message' in courses.vessel ? courses.vessel.message : '' }
			: { ...withoutDeliveries(simulated), demandOurMmolPerLH: demandCourse?.ourMmolPerLH ?? null, check: simulated.reachesTarget ? 'ok' : 'short' },
		defaults,
		notes,
		cautions: STUDY_CAUTIONS
	};
}
