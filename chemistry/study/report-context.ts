import type { requireGrowthData } from './profile';
import type { PlanCourse, PlanCourses } from './time-course';
import type { DefaultUsed, StudyFeedSource } from './types';

/** What the report's sections add to, in the order the report lists them. */
export interface ReportLog {
	defaults: DefaultUsed[];
	notes: string[];
	reasons: string[];
}

/** The study's settings with the what-if applied and checked. */
export interface OperatingPoint {
	targetValue: number;
	target: { biomassGPerL: number; cellsPerMl: number | null };
	feedVolumeL: number;
	/** The study's feeds, volumes scaled to `feedVolumeL`. */
	feeds: StudyFeedSource[];
	kLaPerH: number;
	kLaOrigin: string;
	/** the vessel's map was extrapolated to reach the plan, or null */
	kLaWarning: string | null;
	o2MoleFraction: number;
	temperatureC: number;
}

/** The plan's two simulated runs and the numbers they were run with. */
export interface StudyRun {
	growth: ReturnType<typeof requireGrowthData>;
	yieldXO2GPerG: number;
	initialBiomassGPerL: number;
	courses: PlanCourses;
	/** The plan as written (null when it could not be simulated): the oxygen and heat load. */
	demandCourse: PlanCourse | null;
	/** The plan in this vessel (null when it could not be simulated): time course, run-out, deliveries. */
	simulated: PlanCourse | null;
}

/** Hours as a report shows them. */
export const hours = (h: number) => `${h.toFixed(h < 10 ? 1 : 0)} h`;
