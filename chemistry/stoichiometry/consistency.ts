// The χ² consistency test of a balance with redundant specifications (see ./solve.ts).
import { computeChiSquareCdf, computeChiSquareQuantile } from '../statistics';
import { type SpecificationDeviation, type StoichiometryConsistency, type Spec } from './types';

export function assessConsistency(
	specs: Spec[],
	rates: number[],
	molarMasses: number[],
	redundancy: number,
	confidence: number
): StoichiometryConsistency {
	const maxRate = Math.max(...rates.map(Math.abs));
	const deviations = specs.map((spec): SpecificationDeviation => {
		let fitted: number;
		if (spec.kind === 'rate') fitted = rates[spec.a];
		else {
			const denominator = Math.abs(rates[spec.b]);
			const mass = spec.kind === 'massYield' ? molarMasses[spec.a] / molarMasses[spec.b] : 1;
			fitted = denominator > 0 ? (mass * Math.abs(rates[spec.a])) / denominator : Infinity;
		}
		const scale = spec.value !== 0 ? Math.abs(spec.value) : spec.kind === 'rate' ? maxRate : 1;
		return {
			index: spec.index,
			kind: spec.kind,
			given: spec.value,
			fitted,
			relativeDeviation: (fitted - spec.value) / scale,
			relativeError: spec.relativeError
		};
	});
	const chiSquare = deviations.reduce(
		(acc, d) => acc + (d.relativeDeviation / d.relativeError) ** 2,
		0
	);
	const threshold = computeChiSquareQuantile(confidence, redundancy);
	return {
		redundancy,
		chiSquare,
		threshold,
		confidence,
		pValue: 1 - computeChiSquareCdf(chiSquare, redundancy),
		consistent: chiSquare <= threshold,
		deviations
	};
}
