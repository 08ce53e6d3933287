// Linear algebra of the balance: the null space of the element matrix and the (weighted) least-squares solve in it.
import { Matrix, QrDecomposition, SingularValueDecomposition } from 'ml-matrix';
import { ChemistryInputError } from '../errors';
import { type Species, type Spec } from './types';
import { HINT_ORDER } from './read';

const RANK_TOLERANCE = 1e-10;

interface Decomposition {
	rank: number;
	singularValues: number[];
	/** Right singular vectors as columns, full (cols × cols). */
	v: Matrix;
}

export function decompose(rows: number[][], cols: number): Decomposition {
	// Pad to at least square so the SVD returns the full right basis, null space included.
	const padded = rows.map((r) => [...r]);
	while (padded.length < cols) padded.push(new Array(cols).fill(0));
	const svd = new SingularValueDecomposition(new Matrix(padded), {
		computeLeftSingularVectors: false
	});
	const singularValues = svd.diagonal;
	const max = singularValues[0] ?? 0;
	const rank = max === 0 ? 0 : singularValues.filter((s) => s > max * RANK_TOLERANCE).length;
	return { rank, singularValues, v: svd.rightSingularVectors };
}

export function columns(m: Matrix, from: number, to: number): Matrix {
	return to > from ? m.subMatrix(0, m.rows - 1, from, to - 1) : new Matrix(m.rows, 0);
}

export interface Rows {
	coefficients: number[][];
	rhs: number[];
}

export function buildRows(specs: Spec[], signs: number[], molarMasses: number[], n: number): Rows {
	const coefficients: number[][] = [];
	const rhs: number[] = [];
	for (const spec of specs) {
		const row = new Array(n).fill(0);
		if (spec.kind === 'rate') {
			row[spec.a] = 1;
			rhs.push(spec.value);
		} else if (spec.kind === 'massYield') {
			// |r_p|·M_p − Y·|r_s|·M_s = 0 with |r| = sign·r
			row[spec.a] += signs[spec.a] * molarMasses[spec.a];
			row[spec.b] -= spec.value * signs[spec.b] * molarMasses[spec.b];
			rhs.push(0);
		} else {
			row[spec.a] += signs[spec.a];
			row[spec.b] -= spec.value * signs[spec.b];
			rhs.push(0);
		}
		coefficients.push(row);
	}
	return { coefficients, rhs };
}

/** Residual scale of each row so that residual/scale is the relative deviation of the spec. */
function rowScales(specs: Spec[], rates: number[], molarMasses: number[]): number[] {
	const maxRate = Math.max(...rates.map(Math.abs), Number.MIN_VALUE);
	return specs.map((spec) => {
		if (spec.kind === 'rate') return spec.value !== 0 ? Math.abs(spec.value) : maxRate;
		const denominator = Math.max(Math.abs(rates[spec.b]), maxRate * 1e-9);
		const base = spec.kind === 'massYield' ? denominator * molarMasses[spec.b] : denominator;
		return spec.value !== 0 ? spec.value * base : base;
	});
}

export function multiply(a: number[][], b: Matrix): Matrix {
	return new Matrix(a).mmul(b);
}

function solveLeastSquares(matrix: Matrix, rhs: number[], weights: number[]): Matrix {
	const w = Matrix.diag(weights);
	const a = w.mmul(matrix);
	const y = w.mmul(Matrix.columnVector(rhs));
	return new QrDecomposition(a).solve(y);
}

export interface Solved {
	rates: number[];
	rankM: number;
}

export function solveReduced(
	rows: Rows,
	specs: Spec[],
	nullBasis: Matrix,
	species: Species[],
	molarMasses: number[]
): Solved {
	const d = nullBasis.columns;
	if (specs.length === 0) {
		throw new ChemistryInputError(
			`${d} specification${d === 1 ? ' is' : 's are'} needed (the degrees of freedom of this balance), at least one of them a non-zero rate to set the scale, e.g. the substrate consumed and a yield or a ratio that involves ${joinOr(
				[...species]
					.sort((a, b) => HINT_ORDER.indexOf(a.role) - HINT_ORDER.indexOf(b.role))
					.slice(0, 2)
					.map((s) => s.id),
				'or'
			)}`,
			{ field: 'specifications' }
		);
	}
	const norms = rows.coefficients.map((r) => Math.hypot(...r));
	const normalised = rows.coefficients.map((r, i) => r.map((c) => c / norms[i]));
	const reduced = multiply(normalised, nullBasis);
	const dec = decompose(reduced.to2DArray(), d);
	const rankM = dec.rank;
	if (rankM < d) throwUnderSpecified(d - rankM, columns(dec.v, rankM, d), nullBasis, species, rows);
	if (rows.rhs.every((b) => b === 0)) {
		const first = species.find((s) => s.role === 'substrate') ?? species[0];
		throw new ChemistryInputError(
			`1 more specification is needed: a non-zero rate to set the scale, e.g. { kind: 'rate', species: '${first.id}', mol: -1 }. The yields, ratios and zero rates given fix only proportions, so without it every rate comes out 0`,
			{ field: 'specifications' }
		);
	}
	const bNormalised = rows.rhs.map((b, i) => b / norms[i]);
	const solveRates = (weights: number[]): number[] => {
		const z = solveLeastSquares(reduced, bNormalised, weights);
		return nullBasis.mmul(z).getColumn(0);
	};
	let rates = solveRates(new Array(specs.length).fill(1));
	const redundancy = specs.length - rankM;
	if (redundancy > 0) {
		// Reweight so each row's residual is its relative deviation over its relative error; the
		// scales depend on the solution, so iterate (a few passes settle it).
		for (let pass = 0; pass < 30; pass++) {
			const scales = rowScales(specs, rates, molarMasses);
			const weights = specs.map((s, i) => norms[i] / (scales[i] * s.relativeError));
			const next = solveRates(weights);
			const change = Math.max(...next.map((r, j) => Math.abs(r - rates[j])));
			const size = Math.max(...next.map(Math.abs));
			rates = next;
			if (change <= 1e-14 * size) break;
		}
	}
	return { rates, rankM };
}

export function label(s: Species): string {
	return s.id === s.formula ? s.id : `${s.id} (${s.formula})`;
}

export function joinOr(items: string[], word: string): string {
	if (items.length <= 1) return items.join('');
	return `${items.slice(0, -1).join(', ')} ${word} ${items[items.length - 1]}`;
}

function throwUnderSpecified(
	missing: number,
	reducedNull: Matrix,
	nullBasis: Matrix,
	species: Species[],
	rows: Rows
): never {
	const directions = nullBasis.mmul(reducedNull);
	const scaleOnly = rows.rhs.every((b) => b === 0);
	const undetermined = species.filter((s) => {
		const row = directions.getRow(s.index);
		return Math.max(...row.map(Math.abs)) > 1e-9;
	});
	const plural = missing === 1 ? 'specification is' : 'specifications are';
	if (scaleOnly && missing === 1 && rows.coefficients.length > 0) {
		const first = species.find((s) => s.role === 'substrate') ?? undetermined[0] ?? species[0];
		throw new ChemistryInputError(
			`1 more specification is needed: the specifications fix only yields and ratios, so the scale is open. Add a rate, e.g. { kind: 'rate', species: '${first.id}', mol: -1 }`,
			{ field: 'specifications' }
		);
	}
	const ranked = [...undetermined].sort(
		(a, b) => HINT_ORDER.indexOf(a.role) - HINT_ORDER.indexOf(b.role)
	);
	const suggestions = ranked.slice(0, 2).map((s) => s.id);
	const scaleNote = scaleOnly
		? ' None of them sets the scale, so at least one must be a non-zero rate.'
		: '';
	throw new ChemistryInputError(
		`${missing} more ${plural} needed: the rates of ${joinOr(undetermined.map(label), 'and')} are not yet fixed by the element balances and the specifications given. Add, for example, a rate, a yield or a ratio that involves ${joinOr(suggestions, 'or')}.${scaleNote}`,
		{ field: 'specifications' }
	);
}
