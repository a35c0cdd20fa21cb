/**
 * Least-squares removal of smooth nuisance terms (the scene's own spectral fall-off) before a
 * shape is compared with a model: the nuisance columns are orthonormalised once (modified
 * Gram–Schmidt; G. H. Golub & C. F. Van Loan, Matrix Computations, 4th ed., 2013, §5.2.8) and
 * each vector is replaced by its residual after projection onto them.
 */
export class NuisanceProjector {
	private readonly basis: Float64Array[] = [];

	/** @throws RangeError when the columns have different lengths. */
	constructor(columns: Float64Array[]) {
		for (const column of columns) {
			if (column.length !== columns[0].length) throw new RangeError('nuisance columns must have equal lengths');
			const q = this.residual(column);
			const norm = Math.sqrt(dot(q, q));
			// A column already spanned by the others adds nothing (e.g. a constant on one sample).
			if (norm > 1e-9 * Math.max(1, Math.sqrt(dot(column, column)))) this.basis.push(q.map((v) => v / norm));
		}
	}

	/** y minus its least-squares fit by the nuisance columns. */
	residual(y: ArrayLike<number>): Float64Array {
		const out = Float64Array.from(y);
		for (const q of this.basis) {
			const along = dot(out, q);
			for (let i = 0; i < out.length; i++) out[i] -= along * q[i];
		}
		return out;
	}
}

function dot(a: Float64Array, b: Float64Array): number {
	let s = 0;
	for (let i = 0; i < a.length; i++) s += a[i] * b[i];
	return s;
}

/** Least-squares scale a of a model m fitted to y, a = ⟨y, m⟩ / |m|²; 0 when m is identically zero. */
export function leastSquaresScale(y: Float64Array, m: Float64Array): number {
	const mm = dot(m, m);
	return mm > 0 ? dot(m, y) / mm : 0;
}

/**
 * Pearson correlation of two residuals (both already free of a constant term), r = ⟨a, b⟩ / (|a|·|b|);
 * 0 when either is identically zero.
 */
export function residualCorrelation(a: Float64Array, b: Float64Array): number {
	let ab = 0;
	let aa = 0;
	let bb = 0;
	for (let i = 0; i < a.length; i++) {
		ab += a[i] * b[i];
		aa += a[i] * a[i];
		bb += b[i] * b[i];
	}
	return aa > 0 && bb > 0 ? ab / Math.sqrt(aa * bb) : 0;
}
