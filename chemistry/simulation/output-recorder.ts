// Writes the run's output points at the requested times, from the state or a step's dense output.
import type { DenseInterpolant } from '../ode';
import type { Cut } from './crossings';
import { STATE_COUNT, type FlowPhase, type ModelParameters } from './model';
import { appendOutputPoint, createOutput, type Output } from './output';
import type { RegimeControl } from './regime-control';

/** The first `count` states at tH (output points need the culture's, not the delivered volumes). */
export function interpolate(
	dense: DenseInterpolant,
	tH: number,
	into: number[],
	count = STATE_COUNT
): number[] {
	for (let i = 0; i < count; i++) into[i] = dense(i, tH);
	return into;
}

export class OutputRecorder {
	readonly out: Output;
	/** reused for each output point's stream rates */
	private readonly streamRates: number[];
	/** reused for dense output points */
	private readonly scratch = new Array<number>(STATE_COUNT).fill(0);
	private nextOutput = 0;

	constructor(
		private readonly p: ModelParameters,
		private readonly regimes: RegimeControl,
		private readonly times: number[],
		streamCount: number
	) {
		this.streamRates = new Array<number>(streamCount).fill(0);
		this.out = createOutput(times.length, streamCount);
	}

	/** Writes every output point due at or before tH (+ eps) from the state `y`. */
	recordDueBy(tH: number, eps: number, y: ArrayLike<number>, phase: FlowPhase): void {
		const times = this.times;
		while (this.nextOutput < times.length && times[this.nextOutput] <= tH + eps) {
			this.record(times[this.nextOutput], this.regimes.effectiveState(y), phase);
		}
	}

	/** Appends a point at tH (where a run stops) unless the last point written is already there. */
	appendFinalPoint(tH: number, eps: number, y: ArrayLike<number>, phase: FlowPhase): void {
		const out = this.out;
		if (out.count === 0 || tH - out.t[out.count - 1] > eps) {
			this.appendPoint(tH, this.regimes.effectiveState(y), phase);
		}
	}

	/**
	 * Writes the output points of the step (xOld, x] up to any cut; `segmentEndH` is Infinity in the
	 * last segment, otherwise an output time on it belongs to the next segment (the state after the jump).
	 */
	recordStep(
		cut: Cut | null,
		dense: DenseInterpolant,
		phase: FlowPhase,
		xOld: number,
		x: number,
		segmentEndH: number,
		eps: number
	): void {
		const times = this.times;
		while (this.nextOutput < times.length) {
			const t = times[this.nextOutput];
			if (cut?.kind === 'stop') {
				if (t > cut.tH + eps) break;
				this.recordDense(t < cut.tH ? t : cut.tH, dense, phase);
			} else if (cut?.kind === 'switch') {
				// Output times at the switch belong to the stretch after it.
				if (t >= cut.tH - eps) break;
				this.recordDense(t < xOld ? xOld : t, dense, phase);
			} else {
				if (t > x + eps || t >= segmentEndH - eps) break;
				this.recordDense(t < xOld ? xOld : t > x ? x : t, dense, phase);
			}
		}
	}

	private recordDense(tH: number, dense: DenseInterpolant, phase: FlowPhase): void {
		const state = this.regimes.effectiveState(interpolate(dense, tH, this.scratch));
		this.record(this.times[this.nextOutput], state, phase, tH);
	}

	/** Writes the next output point; `evaluatedAtH` is where the state was taken (clamped into the step). */
	private record(tH: number, state: ArrayLike<number>, phase: FlowPhase, evaluatedAtH = tH): void {
		this.nextOutput++;
		this.appendPoint(tH, state, phase, evaluatedAtH);
	}

	/** Appends an output point from an effective state. */
	private appendPoint(
		tH: number,
		state: ArrayLike<number>,
		phase: FlowPhase,
		evaluatedAtH = tH
	): void {
		const { out, p, regimes, streamRates } = this;
		appendOutputPoint(out, p, regimes.regime, streamRates, tH, state, phase, evaluatedAtH);
	}
}
