import { describe, expect, it } from 'vitest';
import {
	computeChiSquareCdf,
	computeChiSquareQuantile,
	computeStudentTQuantile,
	createStudentT975Table
} from '../../chemistry/statistics';
// Written by tests/chemistry/reference/statistics.py (scipy.stats.chi2 and scipy.stats.t):
//   python3 tests/chemistry/reference/statistics.py > tests/chemistry/reference/statistics.json
import reference from './reference/statistics.json';
import { errorOf } from './input-error';

function expectRelativelyClose(actual: number, expected: number, relativeTolerance: number) {
	expect(Math.abs(actual - expected)).toBeLessThanOrEqual(relativeTolerance * Math.abs(expected));
}

describe('χ² distribution', () => {
	it.each(reference.chiSquareQuantile.map((r) => [r.probability, r.degreesOfFreedom, r.value]))(
		'quantile(%f, %i) agrees with scipy.stats.chi2.ppf',
		(probability, degreesOfFreedom, value) => {
			// SciPy reference (statistics.json): 1e-10 relative, well inside the 1e-12 bracket.
			expectRelativelyClose(computeChiSquareQuantile(probability, degreesOfFreedom), value, 1e-10);
		}
	);

	it.each(reference.chiSquareCdf.map((r) => [r.x, r.degreesOfFreedom, r.value]))(
		'CDF(%f, %i) agrees with scipy.stats.chi2.cdf',
		(x, degreesOfFreedom, value) => {
			// SciPy reference (statistics.json), absolute since the CDF lies in [0, 1].
			expect(computeChiSquareCdf(x, degreesOfFreedom)).toBeCloseTo(value, 12);
		}
	);

	it.each([
		[0.95, 1, 3.841],
		[0.95, 5, 11.07],
		[0.95, 10, 18.307],
		[0.95, 20, 31.41],
		[0.95, 100, 124.342],
		[0.05, 10, 3.94],
		[0.05, 100, 77.929]
	])(
		'quantile(%f, %i) matches the printed table value %f',
		(probability, degreesOfFreedom, table) => {
			// NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.6.7.4 "Critical values of the chi-square
			// distribution", 3 decimals (values from memory; each agrees with scipy.stats.chi2.ppf).
			expect(computeChiSquareQuantile(probability, degreesOfFreedom)).toBeCloseTo(table, 3);
		}
	);

	it('has the closed forms of two degrees of freedom', () => {
		// χ²(2) is exponential with mean 2: F(x) = 1 − e^(−x/2), so the quantile is −2 ln(1 − p).
		for (const p of [0.05, 0.5, 0.95, 0.999]) {
			expect(computeChiSquareQuantile(p, 2)).toBeCloseTo(-2 * Math.log(1 - p), 10);
		}
		expect(computeChiSquareCdf(3, 2)).toBeCloseTo(1 - Math.exp(-1.5), 14);
	});

	it('refuses probabilities outside (0, 1) and fractional degrees of freedom', () => {
		expect(errorOf(() => computeChiSquareQuantile(1, 3)).message).toMatch(/0 < probability < 1/);
		expect(errorOf(() => computeChiSquareQuantile(0.5, 2.5)).message).toMatch(/integer degrees/);
		expect(errorOf(() => computeChiSquareCdf(1, 0)).field).toBe('degreesOfFreedom');
	});
});

describe("Student's t distribution", () => {
	it.each(reference.studentTQuantile.map((r) => [r.probability, r.degreesOfFreedom, r.value]))(
		'quantile(%f, %i) agrees with scipy.stats.t.ppf',
		(probability, degreesOfFreedom, value) => {
			// SciPy reference (statistics.json).
			expectRelativelyClose(computeStudentTQuantile(probability, degreesOfFreedom), value, 1e-10);
		}
	);

	it.each([
		[0.975, 1, 12.706],
		[0.975, 10, 2.228],
		[0.975, 30, 2.042],
		[0.975, 100, 1.984],
		[0.95, 1, 6.314],
		[0.95, 10, 1.812]
	])(
		'quantile(%f, %i) matches the printed table value %f',
		(probability, degreesOfFreedom, table) => {
			// NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.6.7.2 "Critical values of the Student's t
			// distribution", 3 decimals (values from memory; each agrees with scipy.stats.t.ppf).
			expect(computeStudentTQuantile(probability, degreesOfFreedom)).toBeCloseTo(table, 3);
		}
	);

	it('keeps the 97.5 % table within 1e-5 of SciPy beyond the exact range', () => {
		// Above ν = 100 the table uses the Cornish–Fisher expansion; SciPy reference (statistics.json).
		const table = createStudentT975Table(5000);
		expect(table[10]).toBe(computeStudentTQuantile(0.975, 10));
		for (const { degreesOfFreedom, value } of reference.studentT975) {
			expect(Math.abs(table[degreesOfFreedom] - value)).toBeLessThan(1e-5);
		}
	});

	it('refuses a probability outside (0, 1) naming the field', () => {
		expect(errorOf(() => computeStudentTQuantile(0, 3)).field).toBe('probability');
		expect(errorOf(() => computeStudentTQuantile(0.9, 0)).field).toBe('degreesOfFreedom');
	});
});
