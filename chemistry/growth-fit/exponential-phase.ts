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
	const n = t.length;
	const lnX = x.map(Math.log);
	const noiseSdLn = Math.max(estimateNoiseSdLn(t, lnX, excluded), NOISE_FLOOR_LN);
	const roundingSdLn = estimateRoundingSdLn(x);
	const noiseVariance = roundingSdLn.map((r) => Math.max(noiseSdLn, r) ** 2);
	const chiSquare95 = Array.from({ length: n }, (_, k) =>
		k > 0 ? computeChiSquareQuantile(0.95, k) : 0
	);
	const studentT975 = createStudentT975Table(n);
	const maxCurvatureDrop = computeChiSquareQuantile(0.95, 1);

	// For each length, the steepest straight window of that length (where it starts, its slope).
	const steepestByLength = new Float64Array(n + 1).fill(-Infinity);
	const steepestStartByLength = new Int32Array(n + 1).fill(-1);
	// The fastest growth the data show with confidence: the highest lower 95 % bound of a straight
	// window's slope. (The highest slope itself would be a short window's luck in dense noisy data.)
	let fastestLowerBound = -Infinity;
	// What the best window did at each test, to say why when none passes all of them.
	let anyRising = false;
	const closest: ClosestWindows = { rSquared: null, lackOfFit: null, curvature: null };

	// Sums about each window's first point, grown one point at a time: O(n²) windows, each in O(1),
	// and without the cancellation that sums about a fixed origin suffer in the cubic and quartic terms.
	for (let i = 0; i + minPoints <= n; i++) {
		if (excluded.has(i)) continue;
		let u1 = 0,
			u2 = 0,
			u3 = 0,
			u4 = 0,
			v1 = 0,
			v2 = 0,
			uv = 0,
			u2v = 0,
			noiseSum = 0;
		for (let j = i; j < n; j++) {
			if (excluded.has(j)) break;
			const u = t[j] - t[i];
			const v = lnX[j] - lnX[i];
			const uu = u * u;
			u1 += u;
			u2 += uu;
			u3 += uu * u;
			u4 += uu * uu;
			v1 += v;
			v2 += v * v;
			uv += u * v;
			u2v += uu * v;
			noiseSum += noiseVariance[j];
			const m = j - i + 1;
			if (m < minPoints) continue;
			const suu = u2 - (u1 * u1) / m;
			const suv = uv - (u1 * v1) / m;
			const slope = suv / suu;
			if (!(slope > 0)) continue;
			anyRising = true;
			const svv = v2 - (v1 * v1) / m;
			const residualSumSquares = Math.max(0, svv - slope * suv);
			const rSquared = svv > 0 ? 1 - residualSumSquares / svv : 0;
			if (rSquared < minRSquared) {
				if (closest.rSquared === null || rSquared > closest.rSquared.value) {
					closest.rSquared = { value: rSquared, i, j };
				}
				continue;
			}
			const meanNoiseVariance = noiseSum / m;
			const lackOfFitRatio = residualSumSquares / (chiSquare95[m - 2] * meanNoiseVariance);
			if (lackOfFitRatio > 1) {
				if (closest.lackOfFit === null || lackOfFitRatio < closest.lackOfFit.value) {
					const rms = Math.sqrt(residualSumSquares / (m - 2));
					closest.lackOfFit = { value: lackOfFitRatio, i, j, rms };
				}
				continue;
			}
			// The quadratic term made orthogonal to the line: q = u² less its projection on 1 and u.
			const sww = u4 - (u2 * u2) / m;
			const swu = u3 - (u2 * u1) / m;
			const swv = u2v - (u2 * v1) / m;
			const sqq = sww - (swu * swu) / suu;
			const sqv = swv - (swu * suv) / suu;
			const curvatureDrop = sqq > 0 ? Math.min(residualSumSquares, (sqv * sqv) / sqq) : 0;
			if (curvatureDrop > maxCurvatureDrop * meanNoiseVariance) {
				const z = Math.sqrt(curvatureDrop / meanNoiseVariance);
				if (closest.curvature === null || z < closest.curvature.value) {
					closest.curvature = { value: z, i, j };
				}
				continue;
			}
			const slopeVariance = Math.max(residualSumSquares / (m - 2), meanNoiseVariance) / suu;
			const lowerBound = slope - studentT975[m - 2] * Math.sqrt(slopeVariance);
			if (lowerBound > fastestLowerBound) fastestLowerBound = lowerBound;
			if (slope > steepestByLength[m]) {
				steepestByLength[m] = slope;
				steepestStartByLength[m] = i;
			}
		}
	}

	if (fastestLowerBound === -Infinity) {
		throw new ChemistryInputError(
			explainNoExponentialPhase(
				t,
				minPoints,
				minRSquared,
				noiseSdLn,
				anyRising,
				closest,
				excluded.size
			),
			{ field: 'biomassGPerL' }
		);
	}
	if (!(fastestLowerBound > 0)) {
		// Straight runs exist, but none rises by more than the noise alone could draw.
		throw new ChemistryInputError(
			`No exponential phase found: no straight run of ${minPoints} or more points rises by more than the noise could by chance; the highest lower 95 % bound of a slope is ${formatValue(fastestLowerBound)} /h, not above 0.`,
			{ field: 'biomassGPerL' }
		);
	}
	let longest = 0;
	for (let length = n; length >= minPoints; length--) {
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
		noiseSdLn,
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
