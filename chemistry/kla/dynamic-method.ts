/**
 * kLa and OUR during a run by the dynamic method (Taguchi & Humphrey 1966; Bandyopadhyay, Humphrey &
 * Taguchi 1967; from memory): with the air off, dC/dt = −OUR, so OUR is minus the slope of a straight
 * line through the falling DO; with the air back on, dC/dt = kLa·(C* − C) − OUR, whose solution is
 * C(t) = C∞ − (C∞ − C0)·e^(−kLa·t) with C∞ = C* − OUR/kLa: the gassing-out fit of the recovery gives kLa
 * and C∞ (and takes the probe lag the same way), and C* = C∞ + OUR/kLa follows.
 */
import { ChemistryInputError } from '../errors';
import { fieldLabel } from '../field-labels';
import { SECONDS_PER_HOUR } from '../units';
import { O2_MOLAR_MASS_G_PER_MOL } from '../oxygen-saturation';
import { isGiven, readNumber, POSITIVE } from '../input';
import { fitLine, formatValue } from '../growth-fit/regression';
import type { DynamicMethodInput, DynamicMethodResult, Estimate } from './types';
import {
	readDissolvedOxygen,
	readDissolvedOxygenUnit,
	readProbeTimeConstantS,
	readStartIndex,
	readTimesS
} from './read';
import { fitRise } from './gassing-out';
import { createEstimate, scaleEstimate } from './least-squares';

/** Below this R² the gas-off segment is not the straight line the method assumes (common practice). */
const MIN_GAS_OFF_R_SQUARED = 0.95;

export function analyseDynamicMethod(input: DynamicMethodInput): DynamicMethodResult {
	const unit = readDissolvedOxygenUnit(input.dissolvedOxygenUnit, 'dissolvedOxygenUnit');
	const offTimeS = readTimesS(input.gasOff?.timeS, 'gasOff.timeS');
	const offReading = readDissolvedOxygen(
		input.gasOff?.dissolvedOxygen,
		'gasOff.dissolvedOxygen',
		offTimeS.length,
		unit
	);
	const onTimeS = readTimesS(input.gasOn?.timeS, 'gasOn.timeS');
	const onReading = readDissolvedOxygen(
		input.gasOn?.dissolvedOxygen,
		'gasOn.dissolvedOxygen',
		onTimeS.length,
		unit
	);
	if (!(onTimeS[0] > offTimeS[offTimeS.length - 1])) {
		throw new ChemistryInputError(
			`${fieldLabel('gasOn.timeS')}, row 1, is ${onTimeS[0]} s, not after the last gas-off time (${offTimeS[offTimeS.length - 1]} s): the air comes back on after it was turned off.`,
			{ field: 'gasOn.timeS.0' }
		);
	}
	const saturationMgPerL = isGiven(input.saturationMgPerL)
		? readNumber(input.saturationMgPerL, 'saturationMgPerL', POSITIVE)
		: null;
	const probeTimeConstantS = readProbeTimeConstantS(input.probeTimeConstantS, 'probeTimeConstantS');
	const first = readStartIndex(input.gasOnStartS, 'gasOnStartS', onTimeS);
	const gasOnStartS = input.gasOnStartS ?? onTimeS[0];

	const line = fitLine(offTimeS, offReading);
	if (!(line.slope < 0)) {
		throw new ChemistryInputError(
			`${fieldLabel('gasOff.dissolvedOxygen')} does not fall (slope ${formatValue(line.slope * SECONDS_PER_HOUR)} per hour): with the air off the DO must drop at the uptake rate.`,
			{ field: 'gasOff.dissolvedOxygen' }
		);
	}
	const ourPerH = createEstimate(
		-line.slope * SECONDS_PER_HOUR,
		line.slopeStandardError * SECONDS_PER_HOUR,
		line.n - 2
	);
	const recovery = fitRise(
		onTimeS.slice(first).map((t) => t - gasOnStartS),
		onReading.slice(first),
		{ unit, probeTimeConstantS, startS: gasOnStartS, curvePoints: 200 }
	);
	const toMgPerL =
		unit === 'mgPerL' ? 1 : saturationMgPerL === null ? null : saturationMgPerL / 100;
	const ourMgPerLH = toMgPerL === null ? null : scaleEstimate(ourPerH, toMgPerL);
	return {
		ourPerH,
		ourMgPerLH,
		ourMmolPerLH:
			ourMgPerLH === null ? null : scaleEstimate(ourMgPerLH, 1 / O2_MOLAR_MASS_G_PER_MOL),
		kLaPerH: recovery.kLaPerH,
		kLaPerS: recovery.kLaPerS,
		steadyDissolvedOxygen: recovery.saturation,
		saturation: computeSaturation(ourPerH, recovery.kLaPerH, recovery),
		dissolvedOxygenUnit: unit,
		gasOffRSquared: line.rSquared,
		recovery,
		warnings: describeDynamicWarnings(line.rSquared, toMgPerL === null, recovery.warnings)
	};
}

/**
 * C* = C∞ + OUR/kLa; its variance by the delta method: OUR comes from the gas-off segment, independent
 * of the recovery, while C∞ and kLa share the recovery fit's covariance.
 */
function computeSaturation(
	ourPerH: Estimate,
	kLaPerH: Estimate,
	recovery: DynamicMethodResult['recovery']
): { value: number; standardError: number } {
	const k = kLaPerH.value;
	const our = ourPerH.value;
	const [[varKPerS], [covSteadyKPerS, varSteady]] = recovery.covariance;
	const varK = varKPerS * SECONDS_PER_HOUR ** 2;
	const covSteadyK = covSteadyKPerS * SECONDS_PER_HOUR;
	const dK = -our / (k * k);
	const variance =
		varSteady + ourPerH.standardError ** 2 / (k * k) + dK * dK * varK + 2 * dK * covSteadyK;
	return { value: recovery.saturation.value + our / k, standardError: Math.sqrt(variance) };
}

function describeDynamicWarnings(
	gasOffRSquared: number,
	noMgPerL: boolean,
	recoveryWarnings: string[]
): string[] {
	const warnings: string[] = [];
	if (gasOffRSquared < MIN_GAS_OFF_R_SQUARED) {
		warnings.push(
			`The gas-off DO is not a straight line (R² ${formatValue(gasOffRSquared)}, below ${MIN_GAS_OFF_R_SQUARED}, common practice): it may have fallen to where uptake slows, or the air was not fully off. Use only the straight part.`
		);
	}
	if (noMgPerL) {
		warnings.push(
			'The DO is in percent of saturation and no C* in mg/L was given, so OUR is given only in percent per hour.'
		);
	}
	return [...warnings, ...recoveryWarnings.map((w) => `Recovery: ${w}`)];
}
