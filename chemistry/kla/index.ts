// kLa from DO records: the gassing-out test (./gassing-out.ts) and the dynamic method during a run.
export { fitGassingOut } from './gassing-out';
export { analyseDynamicMethod } from './dynamic-method';
export { computeRemainingDeficitFraction } from './probe-response';
export { MIN_KLA_POINTS, MAX_PERCENT_SATURATION } from './read';
export type {
	DissolvedOxygenUnit,
	GassingOutInput,
	GassingOutFit,
	DynamicMethodSegment,
	DynamicMethodInput,
	DynamicMethodResult
} from './types';
export {
	BROTH_DENSITY_KG_PER_M3,
	computeOperatingPoint,
	type OperatingPoint as VesselOperatingPoint,
	type OperatingPointInput,
	type VesselGeometry
} from './operating-point';
