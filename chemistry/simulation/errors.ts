export type SimulationFailureReason =
	'stepLimit' | 'nonFinite' | 'negativeState' | 'integratorMissing' | 'regimeChatter';

/**
 * The integration could not produce a trustworthy result (too many steps, a non-finite value, or a
 * concentration below zero beyond the tolerance). Thrown instead of returning such numbers.
 */
export class SimulationFailedError extends Error {
	readonly reason: SimulationFailureReason;
	/** where the integration had got to, h */
	readonly tH: number;

	constructor(message: string, reason: SimulationFailureReason, tH: number) {
		super(message);
		this.name = 'SimulationFailedError';
		this.reason = reason;
		this.tH = tH;
	}
}
