// The exponential phase: the search over windows of consecutive points described in ./fit.ts.
import { ChemistryInputError } from '../errors';
import { computeChiSquareQuantile, createStudentT975Table } from '../statistics';
import { WINDOW_LENGTH_FRACTION } from './types';
import { formatValue, estimateNoiseSdLn, estimateRoundingSdLn } from './regression';

/** Noise floor of ln X for data without measurement noise (see the top of this file). */
const NOISE_FLOOR_LN = 1e-4;

interface ExponentialPhaseWindow {
	startIndex: number;
	endIndex: number;
	longestStraightPointCount: number;
	noiseSdLn: number;
	/** mean over the window of each point's noise variance (ln units) */
	meanNoiseVariance: number;
}

export function findExponentialPhase(
	t: number[],
	x: number[],
	minPoints: number,
	minRSquared: number,
	excluded: Set<number>
): ExponentialPhaseWindow {
	const lnX = x.map(Math.log);
	const noiseSdLn = Math.max(estimateNoiseSdLn(t, lnX, excluded), NOISE_FLOOR_LN);
	const roundingSdLn = estimateRoundingSdLn(x);
	const noiseVariance = roundingSdLn.map((r) => Math.max(noiseSdLn, r) ** 2);
	const search = new WindowSearch(t.length, minRSquared);
	scanWindows(t, lnX, noiseVariance, minPoints, excluded, search);

	if (search.fastestLowerBound === -Infinity) {
		throw new ChemistryInputError(
			explainNoExponentialPhase(
				t,
				minPoints,
				minRSquared,
				noiseSdLn,
				search.anyRising,
				search.closest,
				excluded.size
			),
			{ field: 'biomassGPerL' }
		);
	}
	if (!(search.fastestLowerBound > 0)) {
		// Straight runs exist, but none rises by more than the noise alone could draw.
		throw new ChemistryInputError(
			`No exponential phase found: no straight run of ${minPoints} or more points rises by more than the noise could by chance; the highest lower 95 % bound of a slope is ${formatValue(search.fastestLowerBound)} /h, not above 0.`,
			{ field: 'biomassGPerL' }
		);
	}
	return { ...chooseWindow(search, minPoints, noiseVariance), noiseSdLn };
}

/**
 * Tries every window of `minPoints` or more consecutive points not crossing an excluded one. Sums
 * about each window's first point, grown one point at a time: O(n²) windows, each in O(1), and
 * without the cancellation that sums about a fixed origin suffer in the cubic and quartic terms.
 */
function scanWindows(
	t: number[],
	lnX: number[],
	noiseVariance: number[],
	minPoints: number,
	excluded: Set<number>,
	search: WindowSearch
): void {
	const n = t.length;
	const sums = new WindowSums();
	for (let i = 0; i + minPoints <= n; i++) {
		if (excluded.has(i)) continue;
		sums.reset();
		for (let j = i; j < n; j++) {
			if (excluded.has(j)) break;
			sums.add(t[j] - t[i], lnX[j] - lnX[i], noiseVariance[j]);
			if (sums.m >= minPoints) search.consider(sums, i, j);
		}
	}
}

/** Sums over a window of u = t − t_first and v = ln X − ln X_first, and of the points' noise variances. */
class WindowSums {
	m = 0;
	u1 = 0;
	u2 = 0;
	u3 = 0;
	u4 = 0;
	v1 = 0;
	v2 = 0;
	uv = 0;
	u2v = 0;
	noiseSum = 0;

	reset(): void {
		this.m = this.u1 = this.u2 = this.u3 = this.u4 = 0;
		this.v1 = this.v2 = this.uv = this.u2v = this.noiseSum = 0;
	}

	add(u: number, v: number, noiseVariance: number): void {
		const uu = u * u;
		this.u1 += u;
		this.u2 += uu;
		this.u3 += uu * u;
		this.u4 += uu * uu;
		this.v1 += v;
		this.v2 += v * v;
		this.uv += u * v;
		this.u2v += uu * v;
		this.noiseSum += noiseVariance;
		this.m++;
	}
}

/** What the window search has found so far: the straight windows and, for the error, the closest misses. */
class WindowSearch {
	/** for each length, the steepest straight window of that length (its slope, where it starts) */
	readonly steepestByLength: Float64Array;
	readonly steepestStartByLength: Int32Array;
	// The fastest growth the data show with confidence: the highest lower 95 % bound of a straight
	// window's slope. (The highest slope itself would be a short window's luck in dense noisy data.)
	fastestLowerBound = -Infinity;
	// What the best window did at each test, to say why when none passes all of them.
	anyRising = false;
	readonly closest: ClosestWindows = { rSquared: null, lackOfFit: null, curvature: null };
	private readonly chiSquare95: number[];
	private readonly studentT975: Float64Array;
	private readonly maxCurvatureDrop = computeChiSquareQuantile(0.95, 1);

	constructor(
		n: number,
		private readonly minRSquared: number
	) {
		this.steepestByLength = new Float64Array(n + 1).fill(-Infinity);
		this.steepestStartByLength = new Int32Array(n + 1).fill(-1);
		this.chiSquare95 = Array.from({ length: n }, (_, k) =>
			k > 0 ? computeChiSquareQuantile(0.95, k) : 0
		);
		this.studentT975 = createStudentT975Table(n);
	}

	/** Tests the window of points i..j (rising, R², lack of fit, curvature) and keeps it if straight. */
	consider(sums: WindowSums, i: number, j: number): void {
		const { m, u1, u2, u3, u4, v1, v2, uv, u2v } = sums;
		const suu = u2 - (u1 * u1) / m;
		const suv = uv - (u1 * v1) / m;
		const slope = suv / suu;
		if (!(slope > 0)) return;
		this.anyRising = true;
		const svv = v2 - (v1 * v1) / m;
		const residualSumSquares = Math.max(0, svv - slope * suv);
		const rSquared = svv > 0 ? 1 - residualSumSquares / svv : 0;
		const closest = this.closest;
		if (rSquared < this.minRSquared) {
			if (closest.rSquared === null || rSquared > closest.rSquared.value) {
				closest.rSquared = { value: rSquared, i, j };
			}
			return;
		}
		const meanNoiseVariance = sums.noiseSum / m;
		const lackOfFitRatio = residualSumSquares / (this.chiSquare95[m - 2] * meanNoiseVariance);
		if (lackOfFitRatio > 1) {
			if (closest.lackOfFit === null || lackOfFitRatio < closest.lackOfFit.value) {
				const rms = Math.sqrt(residualSumSquares / (m - 2));
				closest.lackOfFit = { value: lackOfFitRatio, i, j, rms };
			}
			return;
		}
		// The quadratic term made orthogonal to the line: q = u² less its projection on 1 and u.
		const sww = u4 - (u2 * u2) / m;
		const swu = u3 - (u2 * u1) / m;
		const swv = u2v - (u2 * v1) / m;
		const sqq = sww - (swu * swu) / suu;
		const sqv = swv - (swu * suv) / suu;
		const curvatureDrop = sqq > 0 ? Math.min(residualSumSquares, (sqv * sqv) / sqq) : 0;
		if (curvatureDrop > this.maxCurvatureDrop * meanNoiseVariance) {
			const z = Math.sqrt(curvatureDrop / meanNoiseVariance);
			if (closest.curvature === null || z < closest.curvature.value) {
				closest.curvature = { value: z, i, j };
			}
			return;
		}
		const slopeVariance = Math.max(residualSumSquares / (m - 2), meanNoiseVariance) / suu;
		const lowerBound = slope - this.studentT975[m - 2] * Math.sqrt(slopeVariance);
		if (lowerBound > this.fastestLowerBound) this.fastestLowerBound = lowerBound;
		if (slope > this.steepestByLength[m]) {
			this.steepestByLength[m] = slope;
			this.steepestStartByLength[m] = i;
		}
	}
}

/**
 * The longest straight window at least half as steep as the fastest growth shown with confidence,
 * then the steepest of the windows down to WINDOW_LENGTH_FRACTION of its length.
 */
function chooseWindow(
	search: WindowSearch,
	minPoints: number,
	noiseVariance: number[]
): Omit<ExponentialPhaseWindow, 'noiseSdLn'> {
	const { steepestByLength, steepestStartByLength, fastestLowerBound } = search;
	let longest = 0;
	for (let length = steepestByLength.length - 1; length >= minPoints; length--) {
		if (steepestByLength[length] >= 0.5 * fastestLowerBound) {
			longest = length;
			break;
		}
	}
	const shortest = Math.max(minPoints, Math.ceil(WINDOW_LENGTH_FRACTION * longest));
	let chosenLength = longest;
	for (let length = longest; length >= shortest; length--) {
		if (steepestByLength[length] > steepestByLength[chosenLength]) chosenLength = length;
	}
	const startIndex = steepestStartByLength[chosenLength];
	const endIndex = startIndex + chosenLength - 1;
	let windowNoiseVariance = 0;
	for (let k = startIndex; k <= endIndex; k++) windowNoiseVariance += noiseVariance[k];
	return {
		startIndex,
		endIndex,
		longestStraightPointCount: longest,
		meanNoiseVariance: windowNoiseVariance / chosenLength
	};
}

interface ClosestWindows {
	rSquared: null | { value: number; i: number; j: number };
	lackOfFit: null | { value: number; i: number; j: number; rms: number };
	curvature: null | { value: number; i: number; j: number };
}

function explainNoExponentialPhase(
	t: number[],
	minPoints: number,
	minRSquared: number,
	noiseSdLn: number,
	anyRising: boolean,
	closest: ClosestWindows,
	excludedCount: number
): string {
	const lead = 'No exponential phase found: ';
	const span = (w: { i: number; j: number }) =>
		`${w.j - w.i + 1} points from ${formatValue(t[w.i])} to ${formatValue(t[w.j])} h`;
	const doNote = excludedCount
		? ` (${excludedCount} points with DO below 5 % of its highest were left out)`
		: '';
	if (!anyRising) {
		return `${lead}ln(biomass) does not rise over any ${minPoints} or more consecutive points${doNote}.`;
	}
	if (closest.curvature !== null) {
		const w = closest.curvature;
		return `${lead}every run of ${minPoints} or more points that lies on a line within the noise still bends (test of a quadratic term, 5 % level). The straightest, ${span(w)}, bends with z = ${formatValue(w.value)} where a straight line is kept up to 1.96${doNote}.`;
	}
	if (closest.lackOfFit !== null) {
		const w = closest.lackOfFit;
		return `${lead}every rising run of ${minPoints} or more points with R² ≥ ${minRSquared} scatters about its line more than the measurement noise allows (lack-of-fit test, 95 %). The closest, ${span(w)}, has a residual standard deviation of ${formatValue(w.rms)} in ln(biomass) where the noise estimated from the whole run is ${formatValue(noiseSdLn)}${doNote}.`;
	}
	const w = closest.rSquared!;
	return `${lead}no run of ${minPoints} or more points has ln(biomass) rising on a line with R² ≥ ${minRSquared}. The best, ${span(w)}, has R² = ${w.value.toFixed(3)}${doNote}.`;
}
