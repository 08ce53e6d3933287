// Straight-line regression and the noise estimates the exponential-phase tests compare against.
import { computeStudentTQuantile } from '../statistics';
import { type Estimate } from './types';

interface LineFit {
	slope: number;
	intercept: number;
	/** from the window's own residuals */
	slopeStandardError: number;
	rSquared: number;
	n: number;
	/** Σ(x − x̄)² */
	spreadX: number;
	residualSumSquares: number;
}

/** Ordinary least squares y = a + b·x, two-pass (centred sums). */
export function fitLine(x: number[], y: number[]): LineFit {
	const n = x.length;
	let mx = 0,
		my = 0;
	for (let i = 0; i < n; i++) {
		mx += x[i];
		my += y[i];
	}
	mx /= n;
	my /= n;
	let sxx = 0,
		sxy = 0,
		syy = 0;
	for (let i = 0; i < n; i++) {
		const a = x[i] - mx;
		const b = y[i] - my;
		sxx += a * a;
		sxy += a * b;
		syy += b * b;
	}
	const slope = sxy / sxx;
	const residual = Math.max(0, syy - slope * sxy);
	return {
		slope,
		intercept: my - slope * mx,
		slopeStandardError: n > 2 ? Math.sqrt(residual / (n - 2) / sxx) : Infinity,
		rSquared: syy > 0 ? 1 - residual / syy : 1,
		n,
		spreadX: sxx,
		residualSumSquares: residual
	};
}

export function estimateFrom(value: number, standardError: number, df: number): Estimate {
	const half = computeStudentTQuantile(0.975, df) * standardError;
	return { value, standardError, lower95: value - half, upper95: value + half };
}

/** Three significant digits for messages. */
export function formatValue(value: number): string {
	return Number(value.toPrecision(3)).toString();
}

/**
 * Measurement noise of y (see the top of this file): pseudo-residuals, each point against the line
 * through its neighbours, scaled to unit variance, their median times 1.4826 (the median absolute
 * value of a normal variable over its standard deviation). Triples carrying one value are left out.
 */
export function estimateNoiseSdLn(t: number[], y: number[], excluded: Set<number>): number {
	const scaled: number[] = [];
	for (let i = 1; i < t.length - 1; i++) {
		if (excluded.has(i - 1) || excluded.has(i) || excluded.has(i + 1)) continue;
		if (y[i - 1] === y[i] && y[i] === y[i + 1]) continue;
		const a = (t[i + 1] - t[i]) / (t[i + 1] - t[i - 1]);
		const b = 1 - a;
		const residual = y[i] - a * y[i - 1] - b * y[i + 1];
		scaled.push(Math.abs(residual) / Math.sqrt(1 + a * a + b * b));
	}
	if (scaled.length === 0) return 0;
	scaled.sort((p, q) => p - q);
	const mid = scaled.length >> 1;
	const median = scaled.length % 2 ? scaled[mid] : 0.5 * (scaled[mid - 1] + scaled[mid]);
	return 1.4826 * median;
}

/**
 * Rounding error of each ln X from the digits the data are given with: the step of the last digit,
 * read two ways because a trailing zero does not survive as a number (0.050 reads as 0.05): the most
 * significant digits any value carries (data rounded to significant digits) and the most decimals any
 * value carries (data rounded to fixed decimals); the larger step of the two at each value. Its
 * standard deviation is step/√12 (Sheppard's correction), over X for ln X. Numbers that went through
 * a unit conversion are matched to within 1e-9 of their value.
 */
export function estimateRoundingSdLn(x: number[]): number[] {
	const matches = (value: number, rounded: string) =>
		Math.abs(Number(rounded) - value) <= 1e-9 * Math.abs(value);
	let significantDigits = 1;
	let decimals = 0;
	for (const value of x) {
		let p = 1;
		while (p < 15 && !matches(value, value.toPrecision(p))) p++;
		significantDigits = Math.max(significantDigits, p);
		let d = 0;
		while (d < 15 && !matches(value, value.toFixed(d))) d++;
		decimals = Math.max(decimals, d);
	}
	return x.map((value) => {
		const exponent = Math.floor(Math.log10(value));
		const step = Math.max(10 ** (exponent - significantDigits + 1), 10 ** -decimals);
		return step / Math.sqrt(12) / value;
	});
}

export function createEvenGrid(a: number, b: number, count: number): number[] {
	return Array.from({ length: count }, (_, i) => a + ((b - a) * i) / (count - 1));
}
