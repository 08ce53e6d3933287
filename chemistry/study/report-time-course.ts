import { hours, type OperatingPoint, type ReportLog, type StudyRun } from './report-context';
import type { NutrientSection } from './report-nutrients';
import { findCrossingH, type PlanCourse } from './time-course';
import type { StudyInputs, StudyReport, TimeCourseHold } from './types';

/** A run reaching this fraction of the target counts as reaching it (the course is sampled, not continuous). */
export const REACHES_TARGET_FRACTION = 0.98;

/** The vessel run with its biomass held to the nutrients, and what that course reaches. */
function holdCourse(simulated: PlanCourse, nutrients: NutrientSection, targetGPerL: number) {
	const { hold, lines } = nutrients;
	const biomassGPerL = hold?.biomassGPerL ?? simulated.biomassGPerL;
	const nutrientHold: TimeCourseHold | null =
		hold && hold.fromH !== null
			? {
					fromH: hold.fromH,
					nutrient: lines[hold.lineIndex!].name,
					carbonOnlyBiomassGPerL: simulated.biomassGPerL,
					allowedGPerL: hold.heldToG.map((g, i) => g / simulated.volumeL[i])
				}
			: null;
	return {
		biomassGPerL,
		nutrientHold,
		finalBiomassGPerL: biomassGPerL.at(-1)!,
		reachesTarget: biomassGPerL.some((x) => x >= targetGPerL * REACHES_TARGET_FRACTION),
		targetReachedAtH: findCrossingH(simulated.t, biomassGPerL, targetGPerL)
	};
}

/**
 * The time course: whether the plan, as written and in this vessel, reaches the target within its
 * duration. The course shown is the vessel run held to what the required nutrients supply.
 */
export function assessTimeCourse(
	inputs: StudyInputs,
	point: OperatingPoint,
	run: StudyRun,
	nutrients: NutrientSection,
	log: ReportLog
): StudyReport['timeCourse'] {
	const { plan } = inputs;
	const { demandCourse, simulated, courses } = run;
	const target = point.target.biomassGPerL.toPrecision(3);
	const held = simulated && holdCourse(simulated, nutrients, point.target.biomassGPerL);
	const within = `short of the target ${target} g/L within ${plan.durationH} h`;
	if (demandCourse && !demandCourse.reachesTarget) {
		log.reasons.push(
			`The plan as written reaches ${demandCourse.finalBiomassGPerL.toPrecision(3)} g/L${demandCourse.stoppedAtH !== null ? ` and stops at ${hours(demandCourse.stoppedAtH)}` : ''}, ${within}.`
		);
	} else if (simulated && held && !held.reachesTarget) {
		const limited = simulated.oxygenLimitedH[0];
		const hold = held.nutrientHold;
		const heldBy = hold ? `${hold.nutrient} holds growth from ${hours(hold.fromH)}` : '';
		if (!simulated.reachesTarget) {
			const causes = [
				limited
					? `DO reaches 0 at ${hours(limited.fromH)} and oxygen transfer then sets the pace of growth`
					: '',
				heldBy
			].filter(Boolean);
			log.reasons.push(
				`In this vessel the run reaches ${held.finalBiomassGPerL.toPrecision(3)} g/L, ${within}${causes.length ? `: ${causes.join('; ')}` : ''}.`
			);
		} else if (nutrients.sufficiency.sufficient) {
			// In total the nutrients suffice (else that is the reason already), but not in time.
			log.reasons.push(
				`Held to what the nutrients supply along the run, the culture reaches ${held.finalBiomassGPerL.toPrecision(3)} g/L, ${within}: ${heldBy}, and the feeds bring it too slowly after.`
			);
		}
	}
	if (simulated && simulated.oxygenLimitedH.length > 0 && held?.reachesTarget) {
		log.notes.push(
			`In this vessel DO reaches 0 at ${hours(simulated.oxygenLimitedH[0].fromH)}; growth then runs at what oxygen transfer supplies.`
		);
	}
	if ('message' in courses.vessel)
		log.notes.push(`Time course not available: ${courses.vessel.message}`);
	if (!simulated || !held)
		return {
			check: 'unavailable',
			message: 'message' in courses.vessel ? courses.vessel.message : ''
		};
	const { deliveries: _deliveries, ...course } = simulated;
	return {
		...course,
		...held,
		demandOurMmolPerLH: demandCourse?.ourMmolPerLH ?? null,
		check: held.reachesTarget ? 'ok' : 'short'
	};
}
