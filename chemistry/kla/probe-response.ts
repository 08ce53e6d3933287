/**
 * The fraction of the initial oxygen deficit (C* − C0) a probe still reads t seconds after the rise
 * starts. The liquid follows C = C* − (C* − C0)·e^(−kLa·t); a first-order probe (dCp/dt = (C − Cp)/τp,
 * starting at C0) reads Cp = C* − (C* − C0)·R with
 *   R = (e^(−kLa·t) − kLa·τp·e^(−t/τp)) / (1 − kLa·τp),
 * the standard two-time-constant response (van 't Riet 1979; Garcia-Ochoa & Gomez 2009, review of kLa
 * methods; citation from memory), and R = (1 + t/τp)·e^(−t/τp) where kLa·τp = 1.
 */

/** (1 − e^(−x))/x, which is 1 at x = 0. */
function computeRelativeGrowth(x: number): number {
	return x === 0 ? 1 : -Math.expm1(-x) / x;
}

/**
 * R above. With a = kLa and b = 1/τp, R = (b·e^(−at) − a·e^(−bt))/(b − a) is symmetric in a and b;
 * written as e^(−mt)·(1 + m·t·(1 − e^(−(M−m)t))/((M−m)t)), m and M the smaller and larger rate, it
 * neither cancels near kLa·τp = 1 nor overflows when one rate is much larger.
 */
export function computeRemainingDeficitFraction(
	kLaPerS: number,
	probeTimeConstantS: number | null,
	elapsedS: number
): number {
	if (probeTimeConstantS === null || probeTimeConstantS === 0) return Math.exp(-kLaPerS * elapsedS);
	const probeRatePerS = 1 / probeTimeConstantS;
	const slower = Math.min(kLaPerS, probeRatePerS);
	const faster = Math.max(kLaPerS, probeRatePerS);
	return (
		Math.exp(-slower * elapsedS) *
		(1 + slower * elapsedS * computeRelativeGrowth((faster - slower) * elapsedS))
	);
}

/** ∂R/∂kLa: exact without a probe lag, by central differences with one. */
export function computeRemainingDeficitSlope(
	kLaPerS: number,
	probeTimeConstantS: number | null,
	elapsedS: number
): number {
	if (probeTimeConstantS === null || probeTimeConstantS === 0) {
		return -elapsedS * Math.exp(-kLaPerS * elapsedS);
	}
	const h = 1e-6 * kLaPerS;
	return (
		(computeRemainingDeficitFraction(kLaPerS + h, probeTimeConstantS, elapsedS) -
			computeRemainingDeficitFraction(kLaPerS - h, probeTimeConstantS, elapsedS)) /
		(2 * h)
	);
}
