/**
 * Linear least squares on a harmonic basis {1, cos hθ, sin hθ} (θ = ω·τ), by modified Gram–Schmidt run
 * twice (numerically orthonormal columns even when the record is shorter than a cycle and the basis is
 * poorly conditioned). Internal to lib/signal (the sine fit's inner step).
 * Ref: Björck, Numerical Methods for Least Squares Problems (SIAM 1996), 2.4 (MGS, reorthogonalisation)
 * (from memory).
 */

/** Columns 1, cos θ, sin θ, cos 2θ, sin 2θ, … cos Hθ, sin Hθ at θ_j = ω·τ_j (angle recurrences). */
export function harmonicBasis(tau: Float64Array, omega: number, orders: number): Float64Array[] {
	const m = tau.length;
	const cols: Float64Array[] = [new Float64Array(m).fill(1)];
	for (let h = 1; h <= orders; h++) cols.push(new Float64Array(m), new Float64Array(m));
	for (let j = 0; j < m; j++) {
		const c1 = Math.cos(omega * tau[j]);
		const s1 = Math.sin(omega * tau[j]);
		let c = 1;
		let s = 0;
		for (let h = 1; h <= orders; h++) {
			const c2 = c * c1 - s * s1;
			s = s * c1 + c * s1;
			c = c2;
			cols[2 * h - 1][j] = c;
			cols[2 * h][j] = s;
		}
	}
	return cols;
}

/** Q (orthonormal columns) and R (upper triangular, row-major K×K) with basis = Q·R. */
export interface QrBasis {
	q: Float64Array[];
	r: Float64Array;
	/** For each column, |its part orthogonal to the earlier columns| / |column|: near 0 = not resolvable. */
	independence: Float64Array;
}

function dot(a: Float64Array, b: Float64Array): number {
	let s = 0;
	for (let j = 0; j < a.length; j++) s += a[j] * b[j];
	return s;
}

/** Modified Gram–Schmidt, two passes; `cols` are overwritten by Q. */
export function orthonormalise(cols: Float64Array[]): QrBasis {
	const k = cols.length;
	const r = new Float64Array(k * k);
	const independence = new Float64Array(k);
	for (let i = 0; i < k; i++) {
		const v = cols[i];
		const norm0 = Math.sqrt(dot(v, v));
		for (let pass = 0; pass < 2; pass++) {
			for (let p = 0; p < i; p++) {
				const d = dot(cols[p], v);
				r[p * k + i] += d;
				const qp = cols[p];
				for (let j = 0; j < v.length; j++) v[j] -= d * qp[j];
			}
		}
		const norm = Math.sqrt(dot(v, v));
		independence[i] = norm0 > 0 ? norm / norm0 : 0;
		r[i * k + i] = norm;
		if (norm > 0) for (let j = 0; j < v.length; j++) v[j] /= norm;
	}
	return { q: cols, r, independence };
}

/** Coefficients β (basis·β ≈ y), residual y − basis·β and its sum of squares. */
export function solveOnBasis(
	qr: QrBasis,
	y: Float64Array,
): { beta: Float64Array; residual: Float64Array; rss: number } {
	const k = qr.q.length;
	const z = new Float64Array(k);
	const residual = Float64Array.from(y);
	for (let p = 0; p < k; p++) {
		// MGS order: project the running residual (stabler than Qᵀy in one go)
		const d = dot(qr.q[p], residual);
		z[p] = d;
		const qp = qr.q[p];
		for (let j = 0; j < residual.length; j++) residual[j] -= d * qp[j];
	}
	const beta = new Float64Array(k);
	for (let i = k - 1; i >= 0; i--) {
		let s = z[i];
		for (let p = i + 1; p < k; p++) s -= qr.r[i * k + p] * beta[p];
		beta[i] = qr.r[i * k + i] > 0 ? s / qr.r[i * k + i] : 0;
	}
	return { beta, residual, rss: dot(residual, residual) };
}

/** Removes from v its part in span(Q); returns |result|². */
export function projectOut(qr: QrBasis, v: Float64Array): number {
	for (const qp of qr.q) {
		const d = dot(qp, v);
		for (let j = 0; j < v.length; j++) v[j] -= d * qp[j];
	}
	return dot(v, v);
}

/** Diagonal of (RᵀR)⁻¹ = row sums of squares of R⁻¹: the variance factors of β. */
export function inverseGramDiagonal(qr: QrBasis): Float64Array {
	const k = qr.q.length;
	const inv = new Float64Array(k * k);
	for (let col = 0; col < k; col++) {
		for (let i = col; i >= 0; i--) {
			let s = i === col ? 1 : 0;
			for (let p = i + 1; p <= col; p++) s -= qr.r[i * k + p] * inv[p * k + col];
			inv[i * k + col] = qr.r[i * k + i] > 0 ? s / qr.r[i * k + i] : 0;
		}
	}
	const diag = new Float64Array(k);
	for (let i = 0; i < k; i++) for (let col = i; col < k; col++) diag[i] += inv[i * k + col] ** 2;
	return diag;
}
