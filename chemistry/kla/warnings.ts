// What a person should know before trusting a gassing-out kLa.
import { formatValue } from '../growth-fit/regression';
import type { GassingOutFit } from './types';

/** Points wanted within the first 1/kLa of the rise, where kLa shows most (common practice). */
const MIN_POINTS_IN_FIRST_TIME_CONSTANT = 5;
/** e-folds the record should span to show its plateau: 3/kLa is 95 % of the way (common practice). */
const PLATEAU_TIME_CONSTANTS = 3;
/** Degrees of freedom below which the interval is wide mostly from the t quantile. */
const FEW_DEGREES_OF_FREEDOM = 10;

export function describeGassingOutWarnings(fit: GassingOutFit, elapsedS: number[]): string[] {
	const warnings: string[] = [];
	const kLaPerS = fit.kLaPerS.value;
	const timeConstantS = 1 / kLaPerS;
	const tau = fit.probeTimeConstantS;
	const oneOverKla = `1/kLa = ${formatValue(timeConstantS)} s`;
	if (tau === null) {
		warnings.push(
			`No probe time constant was entered, so the probe is taken as instantaneous. That holds only when τp is well below ${oneOverKla} (van 't Riet 1979, from memory; common practice); a slower probe makes this kLa too low.`
		);
	} else if (tau >= timeConstantS) {
		warnings.push(
			`The probe time constant τp = ${formatValue(tau)} s is not small against ${oneOverKla}; common practice (van 't Riet 1979, from memory) asks τp < 1/kLa. This kLa rests on the entered τp: an error in τp moves kLa nearly in proportion.`
		);
	}
	const spanS = elapsedS[elapsedS.length - 1];
	if (spanS * kLaPerS < PLATEAU_TIME_CONSTANTS) {
		const reached = 100 * (1 - Math.exp(-spanS * kLaPerS));
		warnings.push(
			`The readings stop ${formatValue(spanS)} s into the rise, ${formatValue(spanS * kLaPerS)} × 1/kLa, about ${formatValue(reached)} % of the way to C*: the data do not reach a plateau, so C* is extrapolated and kLa with it. Record until the DO levels off (at least ${PLATEAU_TIME_CONSTANTS}/kLa, common practice).`
		);
	}
	const early = elapsedS.filter((t) => t <= timeConstantS).length;
	if (early < MIN_POINTS_IN_FIRST_TIME_CONSTANT) {
		warnings.push(
			`Only ${early} of the points fall within the first ${oneOverKla} of the rise; sample more often for a kLa this high (at least ${MIN_POINTS_IN_FIRST_TIME_CONSTANT} there, common practice).`
		);
	}
	if (fit.degreesOfFreedom < FEW_DEGREES_OF_FREEDOM) {
		warnings.push(
			`Only ${fit.pointsUsed} points for three parameters: the 95 % interval is wide for that reason alone.`
		);
	}
	if (fit.kLaPerS.lower95 === null) {
		warnings.push('kLa is not determined by these data: its 95 % interval reaches 0.');
	}
	return warnings;
}
