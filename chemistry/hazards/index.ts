// Hazard communication: GHS classes, a solution's statements at its concentrations, protective equipment.
export * from './classes';
export {
	classifySolution,
	type AcuteToxicityEstimates,
	type ClassifySolutionOptions,
	type InhalationForm,
	type SolutionClassification,
	type SolutionHazard,
	type SolutionIngredient,
	type SolutionNotice
} from './mixture';
export * from './ppe';
export * from './ph-adjusters';
