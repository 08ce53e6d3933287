// Sufficiency studies: a study's loaded data and what-if in, its report out. No database here.
export * from './vocabulary';
export * from './types';
export {
	OXYGEN_ENRICHMENT_CAUTION,
	STUDY_CAUTIONS,
	isOxygenEnriched,
	studyCautions
} from './cautions';
export { StudyDataError, asStudyDataError } from './errors';
export {
	MAX_BIOMASS_G_PER_L,
	STUDY_TEMPERATURE_RANGE_C,
	convertCellsPerMlToGPerL,
	convertTargetToBiomass,
	evaluateStudy
} from './evaluate';
export {
	simulatePlan,
	isControlled,
	type PlanRun,
	type PlanCourse,
	type PlanCourses,
	type FeedDelivery
} from './time-course';
export {
	findBiomassAllowedG,
	findRunoutTimes,
	findEmptyTime,
	findStretch,
	type Runout,
	type RunoutInput
} from './nutrient-runout';
export { holdToNutrients, type NutrientHold } from './nutrient-hold';
export * from './profile-yields';
export * from './profile';
export { MAX_KLA_PER_H, computeVesselKLa, type PlannedOperation } from './vessel';
export * from './feed-designer';
