/**
 * The kLa correlation kLa = K·(P/V)^a·v_s^b (van 't Riet 1979 form; P/V in W/m³, v_s in m/s, kLa in
 * 1/s, as chemistry/study/vessel.ts uses it) fitted to a vessel's own measurements by linear least
 * squares on logarithms, ln kLa = ln K + a·ln(P/V) + b·ln v_s, with standard errors and 95 % intervals;
 * plus the two inputs a correlation needs: ungassed impeller power and superficial gas velocity.
 */
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { ChemistryInputError } from './errors';
import { readPositive } from './input';
import { computeStudentTQuantile } from './statistics';
import { SECONDS_PER_HOUR } from './units';

export interface KlaPoint {
	powerPerVolumeWPerM3: number;
	superficialVelocityMPerS: number;
	kLaPerS: number;
}

export interface KlaInterval {
	low: number;
	high: number;
}

export interface KlaCorrelationFit {
	k: number;
	a: number;
	b: number;
	/** n − 3 */
	degreesOfFreedom: number;
	/** of ln K, a, b; null with fewer than 4 points (no degrees of freedom left for the scatter) */
	standardErrors: { lnK: number; a: number; b: number } | null;
	/** 95 % intervals from Student's t with n − 3 degrees of freedom; K's is exp of ln K's, so uneven */
	intervals95: { k: KlaInterval; a: KlaInterval; b: KlaInterval } | null;
	/** why there are no intervals, or null */
	intervalNote: string | null;
	/** on ln kLa, the scale of the fit */
	rSquared: number;
	points: (KlaPoint & { predictedKLaPerS: number })[];
	measuredRange: { powerPerVolumeWPerM3: KlaInterval; superficialVelocityMPerS: KlaInterval };
}

const MIN_POINTS = 3;
const MIN_POINTS_FOR_INTERVALS = 4;
/** Below this spread of ln(P/V) or ln v_s (0.1 %) a column is taken as constant. */
const MIN_LOG_SPREAD = 1e-3;
/** Centred ln(P/V) and ln v_s more correlated than this cannot be told apart. */
const MAX_ABS_CORRELATION = 1 - 1e-8;

const POINT_LABELS: Record<keyof KlaPoint, string> = {
	powerPerVolumeWPerM3: 'P/V',
	superficialVelocityMPerS: 'superficial gas velocity',
	kLaPerS: 'kLa'
};

function readPoints(points: readonly KlaPoint[]): KlaPoint[] {
	if (!Array.isArray(points) || points.length < MIN_POINTS) {
		throw new ChemistryInputError(
			`The kLa fit needs at least ${MIN_POINTS} measured points (K, a and b are three unknowns), and at least ${MIN_POINTS_FOR_INTERVALS} for confidence intervals; got ${Array.isArray(points) ? points.length : 0}.`,
			{ field: 'points' }
		);
	}
	return points.map((p, i) => {
		const read = (key: keyof KlaPoint) =>
			readPositive(p?.[key], `points.${i}.${key}`, `Point ${i + 1} ${POINT_LABELS[key]}`);
		return {
			powerPerVolumeWPerM3: read('powerPerVolumeWPerM3'),
			superficialVelocityMPerS: read('superficialVelocityMPerS'),
			kLaPerS: read('kLaPerS')
		};
	});
}

function centred(values: number[]): number[] {
	const mean = values.reduce((s, v) => s + v, 0) / values.length;
	return values.map((v) => v - mean);
}

function spread(values: number[]): number {
	return Math.max(...values) - Math.min(...values);
}

/** Refuses a design whose columns cannot be separated, saying which and why. */
function checkDesign(lnPv: number[], lnVs: number[]): void {
	const refuse = (message: string, field: string) => {
		throw new ChemistryInputError(message, { field });
	};
	if (spread(lnPv) < MIN_LOG_SPREAD) {
		refuse(
			'All points have the same P/V, so its exponent a cannot be fitted: measure at several power inputs.',
			'points.0.powerPerVolumeWPerM3'
		);
	}
	if (spread(lnVs) < MIN_LOG_SPREAD) {
		refuse(
			'All points have the same superficial gas velocity, so its exponent b cannot be fitted: measure at several gas flows.',
			'points.0.superficialVelocityMPerS'
		);
	}
	const x = centred(lnPv);
	const y = centred(lnVs);
	const dot = (u: number[], v: number[]) => u.reduce((s, ui, i) => s + ui * v[i], 0);
	const correlation = dot(x, y) / Math.sqrt(dot(x, x) * dot(y, y));
	if (Math.abs(correlation) > MAX_ABS_CORRELATION) {
		refuse(
			'P/V and superficial gas velocity change together in fixed proportion (on a log scale) across the points, so their effects a and b cannot be told apart: vary one while holding the other.',
			'points'
		);
	}
}

function interval(centre: number, halfWidth: number): KlaInterval {
	return { low: centre - halfWidth, high: centre + halfWidth };
}

function rangeOf(values: number[]): KlaInterval {
	return { low: Math.min(...values), high: Math.max(...values) };
}

/** K, a and b of kLa = K·(P/V)^a·v_s^b by least squares on ln kLa. */
export function fitKlaCorrelation(measured: readonly KlaPoint[]): KlaCorrelationFit {
	const points = readPoints(measured);
	const lnPv = points.map((p) => Math.log(p.powerPerVolumeWPerM3));
	const lnVs = points.map((p) => Math.log(p.superficialVelocityMPerS));
	const lnKla = points.map((p) => Math.log(p.kLaPerS));
	checkDesign(lnPv, lnVs);

	const design = new Matrix(points.map((_, i) => [1, lnPv[i], lnVs[i]]));
	const svd = new SingularValueDecomposition(design, { autoTranspose: true });
	const [lnK, a, b] = svd.solve(Matrix.columnVector(lnKla)).getColumn(0);
	const predictedLn = points.map((_, i) => lnK + a * lnPv[i] + b * lnVs[i]);
	const residualSumOfSquares = lnKla.reduce((s, y, i) => s + (y - predictedLn[i]) ** 2, 0);
	const totalSumOfSquares = centred(lnKla).reduce((s, d) => s + d * d, 0);
	const degreesOfFreedom = points.length - 3;

	let standardErrors: KlaCorrelationFit['standardErrors'] = null;
	let intervals95: KlaCorrelationFit['intervals95'] = null;
	if (degreesOfFreedom > 0) {
		// Cov = s²·(XᵀX)⁻¹ = s²·V·Σ⁻²·Vᵀ from the decomposition already made.
		const variance = residualSumOfSquares / degreesOfFreedom;
		const v = svd.rightSingularVectors;
		const sigma = svd.diagonal;
		const diagonalOfInverse = [0, 1, 2].map((j) =>
			sigma.reduce((s, sk, k) => s + (v.get(j, k) / sk) ** 2, 0)
		);
		const [seLnK, seA, seB] = diagonalOfInverse.map((d) => Math.sqrt(variance * d));
		standardErrors = { lnK: seLnK, a: seA, b: seB };
		const t = computeStudentTQuantile(0.975, degreesOfFreedom);
		intervals95 = {
			k: { low: Math.exp(lnK - t * seLnK), high: Math.exp(lnK + t * seLnK) },
			a: interval(a, t * seA),
			b: interval(b, t * seB)
		};
	}
	return {
		k: Math.exp(lnK),
		a,
		b,
		degreesOfFreedom,
		standardErrors,
		intervals95,
		intervalNote:
			degreesOfFreedom > 0
				? null
				: `Three points fit K, a and b exactly and leave nothing to judge the scatter by; confidence intervals need at least ${MIN_POINTS_FOR_INTERVALS} points.`,
		rSquared: totalSumOfSquares > 0 ? 1 - residualSumOfSquares / totalSumOfSquares : 1,
		points: points.map((p, i) => ({ ...p, predictedKLaPerS: Math.exp(predictedLn[i]) })),
		measuredRange: {
			powerPerVolumeWPerM3: rangeOf(points.map((p) => p.powerPerVolumeWPerM3)),
			superficialVelocityMPerS: rangeOf(points.map((p) => p.superficialVelocityMPerS))
		}
	};
}

export interface KlaPrediction {
	kLaPerS: number;
	kLaPerH: number;
	/** true when P/V or v_s lies outside what was measured: the correlation is then extrapolated */
	outsideMeasuredRange: boolean;
	powerPerVolumeOutside: boolean;
	superficialVelocityOutside: boolean;
}

type FittedCorrelation = Pick<KlaCorrelationFit, 'k' | 'a' | 'b' | 'measuredRange'>;

export function predictKla(
	fit: FittedCorrelation,
	powerPerVolumeWPerM3: number,
	superficialVelocityMPerS: number
): KlaPrediction {
	const pv = readPositive(powerPerVolumeWPerM3, 'powerPerVolumeWPerM3', 'P/V');
	const vs = readPositive(
		superficialVelocityMPerS,
		'superficialVelocityMPerS',
		'Superficial gas velocity'
	);
	const kLaPerS = fit.k * pv ** fit.a * vs ** fit.b;
	const outside = (x: number, r: KlaInterval) => x < r.low || x > r.high;
	const powerPerVolumeOutside = outside(pv, fit.measuredRange.powerPerVolumeWPerM3);
	const superficialVelocityOutside = outside(vs, fit.measuredRange.superficialVelocityMPerS);
	return {
		kLaPerS,
		kLaPerH: kLaPerS * SECONDS_PER_HOUR,
		outsideMeasuredRange: powerPerVolumeOutside || superficialVelocityOutside,
		powerPerVolumeOutside,
		superficialVelocityOutside
	};
}

/** Power number of a Rushton turbine in turbulent flow: about 5 (5–6 quoted), common practice. */
export const RUSHTON_POWER_NUMBER = 5;

export interface UngassedPowerInput {
	/** default RUSHTON_POWER_NUMBER */
	powerNumber?: number;
	speedPerS: number;
	impellerDiameterM: number;
	densityKgPerM3: number;
}

/**
 * Ungassed impeller power P = Np·ρ·N³·D⁵ in W (the standard impeller power relation, valid where Np is
 * constant: turbulent flow, Re = ρND²/μ above about 10⁴; from memory). Gassing lowers it.
 */
export function ungassedPowerW(input: UngassedPowerInput): number {
	const np =
		input.powerNumber === undefined
			? RUSHTON_POWER_NUMBER
			: readPositive(input.powerNumber, 'powerNumber', 'Power number');
	const n = readPositive(input.speedPerS, 'speedPerS', 'Stirrer speed');
	const d = readPositive(input.impellerDiameterM, 'impellerDiameterM', 'Impeller diameter');
	const rho = readPositive(input.densityKgPerM3, 'densityKgPerM3', 'Liquid density');
	return np * rho * n ** 3 * d ** 5;
}

/**
 * Superficial gas velocity v_s = Q/(π·D_t²/4) in m/s. Q is the volumetric flow through the vessel;
 * a flow in standard litres differs from it by the vessel's temperature and pressure.
 */
export function superficialGasVelocityMPerS(input: {
	gasFlowLPerMin: number;
	vesselDiameterM: number;
}): number {
	const flowLPerMin = readPositive(input.gasFlowLPerMin, 'gasFlowLPerMin', 'Gas flow');
	const diameterM = readPositive(input.vesselDiameterM, 'vesselDiameterM', 'Vessel diameter');
	const flowM3PerS = flowLPerMin / 1000 / 60;
	return flowM3PerS / ((Math.PI * diameterM ** 2) / 4);
}
