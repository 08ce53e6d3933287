// The public surface of the science library. The app imports only from here.
export * from './errors';
export * from './field-labels';
export { numberMessage, type Bounds } from './input';
export * from './formula';
export * from './formula-schema';
export * from './schema-binding';
export { ATOMIC_WEIGHTS, ELEMENT_NAMES } from './data/atomic-weights';
export * from './units';
export * from './components';
export * from './composition';
export * from './feed-design';
export * from './weighing';
export * from './oxygen';
export * from './oxygen-saturation-schema';
export * from './heat';
export * from './oxygen-load';
export * from './off-gas/balance';
export * from './kla-correlation';
export * from './degree-of-reduction';
export * from './stoichiometry';
export * from './sufficiency';
export * from './profile-elements';
export * from './data/element-roles';
export * from './substrate-yield';
export {
	AVERAGE_BIOMASS_FORMULA,
	BIOMASS_COMPOSITIONS,
	STANDARD_BIOMASS_FORMULA,
	findBiomassComposition,
	organicMassFractions
} from './data/biomass';
export type {
	BiomassComposition,
	SourcedValue,
	Confidence as BiomassValueConfidence
} from './data/biomass';
export * from './simulation';
export * from './chemostat';
export * from './chemostat-schema';
export * from './productivity';
export * from './productivity-schema';
export * from './growth-fit';
export * from './kla';
export * from './run';
export * from './study';
export * from './statistics';
export * from './hazards';
