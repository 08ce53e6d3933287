// Dense LU factorisation with partial pivoting (Golub & Van Loan, Matrix Computations, 4th ed.,
// Algorithm 3.4.1) and the two triangular solves. Written here rather than taken from ml-matrix:
// the systems are 5–13 states, factored once per step, and ml-matrix's LuDecomposition allocates
// new matrices on every call, which would cost more than the arithmetic itself.

/**
 * Factors the row-major n × n matrix `a` in place into L (unit lower, below the diagonal) and U,
 * recording the row swapped into place at each column in `pivots`. Returns false when a pivot is
 * exactly zero (the matrix is singular to working precision).
 */
export function factorLu(a: number[], n: number, pivots: number[]): boolean {
	for (let k = 0; k < n; k++) {
		let pivotRow = k;
		let largest = Math.abs(a[k * n + k]);
		for (let i = k + 1; i < n; i++) {
			const candidate = Math.abs(a[i * n + k]);
			if (candidate > largest) {
				largest = candidate;
				pivotRow = i;
			}
		}
		pivots[k] = pivotRow;
		if (largest === 0) return false;
		if (pivotRow !== k) {
			for (let j = 0; j < n; j++) {
				const held = a[k * n + j];
				a[k * n + j] = a[pivotRow * n + j];
				a[pivotRow * n + j] = held;
			}
		}
		const pivot = a[k * n + k];
		for (let i = k + 1; i < n; i++) {
			const factor = a[i * n + k] / pivot;
			a[i * n + k] = factor;
			if (factor === 0) continue;
			for (let j = k + 1; j < n; j++) a[i * n + j] -= factor * a[k * n + j];
		}
	}
	return true;
}

/** Solves A x = b in place (`b` becomes x) with the factors from `factorLu`. */
export function solveLu(lu: number[], n: number, pivots: number[], b: number[]): void {
	for (let k = 0; k < n; k++) {
		const p = pivots[k];
		if (p !== k) {
			const held = b[k];
			b[k] = b[p];
			b[p] = held;
		}
	}
	for (let i = 1; i < n; i++) {
		let sum = b[i];
		for (let j = 0; j < i; j++) sum -= lu[i * n + j] * b[j];
		b[i] = sum;
	}
	for (let i = n - 1; i >= 0; i--) {
		let sum = b[i];
		for (let j = i + 1; j < n; j++) sum -= lu[i * n + j] * b[j];
		b[i] = sum / lu[i * n + i];
	}
}
