/**
 * Divergence of the normalised gradient, div(∇u / |∇u|), of a rows×cols array: forward differences
 * for ∇u, backward differences for div (adjoint pair), |∇u| = √(u_x² + u_y² + ε²) so flat regions
 * give 0 instead of 0/0. This is the (negative) gradient of the total variation used by RL-TV.
 * @see L. I. Rudin, S. Osher, E. Fatemi, "Nonlinear total variation based noise removal algorithms",
 *   Physica D 60:259–268, 1992, doi:10.1016/0167-2789(92)90242-F;
 *   N. Dey et al., "Richardson–Lucy algorithm with total variation regularization for 3D confocal
 *   microscope deconvolution", Microscopy Research and Technique 69(4):260–266, 2006,
 *   doi:10.1002/jemt.20294.
 * @param out receives the divergence; gx, gy are scratch buffers of the same length.
 */
export function tvDivergence(u: Float32Array, rows: number, cols: number, out: Float32Array, gx: Float32Array, gy: Float32Array, epsilon = 1e-4): void {
	const e2 = epsilon * epsilon;
	for (let i = 0; i < rows; i++) {
		for (let j = 0; j < cols; j++) {
			const p = i * cols + j;
			const dx = j + 1 < cols ? u[p + 1] - u[p] : 0;
			const dy = i + 1 < rows ? u[p + cols] - u[p] : 0;
			const norm = Math.sqrt(dx * dx + dy * dy + e2);
			gx[p] = dx / norm;
			gy[p] = dy / norm;
		}
	}
	for (let i = 0; i < rows; i++) {
		for (let j = 0; j < cols; j++) {
			const p = i * cols + j;
			const ax = (j + 1 < cols ? gx[p] : 0) - (j > 0 ? gx[p - 1] : 0);
			const ay = (i + 1 < rows ? gy[p] : 0) - (i > 0 ? gy[p - cols] : 0);
			out[p] = ax + ay;
		}
	}
}
