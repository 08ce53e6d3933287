// One RODAS step: the six stages, the error estimate and the continuous output's coefficients.
import { solveLu } from './lu';
import { RODAS } from './rodas-tableau';
import type { Derivative } from './types';

// Read once into module constants: property reads on an imported object in the loops below would
// cost a lookup each (a getter call where the module is transpiled to CommonJS, as under tsx).
const {
	a21,
	a31,
	a32,
	a41,
	a42,
	a43,
	a51,
	a52,
	a53,
	a54,
	c2,
	c21,
	c3,
	c31,
	c32,
	c4,
	c41,
	c42,
	c43,
	c51,
	c52,
	c53,
	c54,
	c61,
	c62,
	c63,
	c64,
	c65,
	d1,
	d2,
	d21,
	d22,
	d23,
	d24,
	d25,
	d3,
	d31,
	d32,
	d33,
	d34,
	d35,
	d4
} = RODAS;

function zeros(n: number): number[] {
	return new Array<number>(n).fill(0);
}

/** Work arrays and results of one step, reused from step to step. */
export class RodasStep {
	/** the solution at t + h after `attempt` */
	readonly yNew: number[];
	private readonly k1: number[];
	private readonly k2: number[];
	private readonly k3: number[];
	private readonly k4: number[];
	private readonly k5: number[];
	private readonly k6: number[];
	private readonly stage: number[];
	/** continuous output: y₀, y₁ and the two corrections (see rodas-tableau.ts) */
	private readonly y0: number[];
	private readonly y1: number[];
	private readonly dense2: number[];
	private readonly dense3: number[];
	private tOld = 0;
	private h = 1;

	constructor(private readonly n: number) {
		this.yNew = zeros(n);
		this.k1 = zeros(n);
		this.k2 = zeros(n);
		this.k3 = zeros(n);
		this.k4 = zeros(n);
		this.k5 = zeros(n);
		this.k6 = zeros(n);
		this.stage = zeros(n);
		this.y0 = zeros(n);
		this.y1 = zeros(n);
		this.dense2 = zeros(n);
		this.dense3 = zeros(n);
	}

	/**
	 * Computes the step from (t, y) of size h, given f(t, y) as `f0`, ∂f/∂t as `ft` and the LU factors
	 * of I/(hγ) − J. Leaves the solution in `yNew`; returns the number of evaluations (5).
	 */
	attempt(
		f: Derivative,
		t: number,
		y: number[],
		h: number,
		f0: number[],
		ft: number[],
		lu: number[],
		pivots: number[]
	): number {
		const { n, k1, k2, k3, k4, k5, k6, stage, yNew } = this;
		const hd1 = h * d1;
		const hd2 = h * d2;
		const hd3 = h * d3;
		const hd4 = h * d4;
		const r = 1 / h;
		for (let i = 0; i < n; i++) k1[i] = f0[i] + hd1 * ft[i];
		solveLu(lu, n, pivots, k1);

		for (let i = 0; i < n; i++) stage[i] = y[i] + a21 * k1[i];
		let d = f(t + c2 * h, stage);
		for (let i = 0; i < n; i++) k2[i] = d[i] + hd2 * ft[i] + r * c21 * k1[i];
		solveLu(lu, n, pivots, k2);

		for (let i = 0; i < n; i++) stage[i] = y[i] + a31 * k1[i] + a32 * k2[i];
		d = f(t + c3 * h, stage);
		for (let i = 0; i < n; i++) k3[i] = d[i] + hd3 * ft[i] + r * (c31 * k1[i] + c32 * k2[i]);
		solveLu(lu, n, pivots, k3);

		for (let i = 0; i < n; i++) stage[i] = y[i] + a41 * k1[i] + a42 * k2[i] + a43 * k3[i];
		d = f(t + c4 * h, stage);
		for (let i = 0; i < n; i++) {
			k4[i] = d[i] + hd4 * ft[i] + r * (c41 * k1[i] + c42 * k2[i] + c43 * k3[i]);
		}
		solveLu(lu, n, pivots, k4);

		for (let i = 0; i < n; i++) {
			stage[i] = y[i] + a51 * k1[i] + a52 * k2[i] + a53 * k3[i] + a54 * k4[i];
		}
		d = f(t + h, stage);
		for (let i = 0; i < n; i++) {
			k5[i] = d[i] + r * (c51 * k1[i] + c52 * k2[i] + c53 * k3[i] + c54 * k4[i]);
		}
		solveLu(lu, n, pivots, k5);

		// The embedded solution, then the last stage: its correction is the error estimate.
		for (let i = 0; i < n; i++) stage[i] += k5[i];
		d = f(t + h, stage);
		for (let i = 0; i < n; i++) {
			const c = c61 * k1[i] + c62 * k2[i] + c63 * k3[i] + c64 * k4[i] + c65 * k5[i];
			k6[i] = d[i] + r * c;
		}
		solveLu(lu, n, pivots, k6);
		for (let i = 0; i < n; i++) yNew[i] = stage[i] + k6[i];
		return 5;
	}

	/**
	 * The largest error estimate over the components, each scaled by aᵢ + r·max(|yᵢ|, |yNewᵢ|): the
	 * tolerance holds on every component. (rodas.f takes the RMS over components, which lets one
	 * component's error reach √n times the tolerance while the others are exact.) NaN when a stage
	 * was not finite.
	 */
	errorNorm(y: number[], absoluteTolerance: number, relativeTolerance: number): number {
		const { n, k6, yNew } = this;
		let largest = 0;
		for (let i = 0; i < n; i++) {
			const a = Math.abs(y[i]);
			const b = Math.abs(yNew[i]);
			const e = Math.abs(k6[i]) / (absoluteTolerance + relativeTolerance * (a > b ? a : b));
			// Written so that a NaN estimate is passed on rather than skipped.
			if (!(e <= largest)) largest = e;
		}
		return largest;
	}

	/** Keeps the accepted step's continuous output: from (tOld, y) over h to yNew. */
	keepDenseOutput(tOld: number, y: number[], h: number): void {
		const { n, k1, k2, k3, k4, k5 } = this;
		this.tOld = tOld;
		this.h = h;
		for (let i = 0; i < n; i++) {
			this.y0[i] = y[i];
			this.y1[i] = this.yNew[i];
			this.dense2[i] = d21 * k1[i] + d22 * k2[i] + d23 * k3[i] + d24 * k4[i] + d25 * k5[i];
			this.dense3[i] = d31 * k1[i] + d32 * k2[i] + d33 * k3[i] + d34 * k4[i] + d35 * k5[i];
		}
	}

	/** The continuous output of the last kept step, component `component` at t. */
	readonly interpolate = (component: number, t: number): number => {
		const s = (t - this.tOld) / this.h;
		const s1 = 1 - s;
		const i = component;
		return this.y0[i] * s1 + s * (this.y1[i] + s1 * (this.dense2[i] + s * this.dense3[i]));
	};
}
