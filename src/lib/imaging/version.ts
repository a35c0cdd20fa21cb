/**
 * Identifies the numerical engine in every run record. Bump it whenever output bytes could change
 * (kernel rasterisation, FFT backend arithmetic, defaults, auto-mode rules), so a replay with the
 * same version is expected to reproduce the result bit for bit. The FFT backend is recorded beside it
 * (`record.padding.fft`); the same version with the same backend name gives the same bytes.
 * 1.1.0: PFFFT (WASM, float32) backend with 5-smooth padding, fused block convolution.
 * 1.2.0: auto mode runs twice as many RL-TV iterations (0.6/σ, clamped to [50, 100]).
 * 1.3.0: the run record's worst-hit directions are ranked by the lowest lost frequency, and an
 *        isotropic blur names none (image bytes unchanged; record bytes differ).
 */
export const ENGINE_VERSION = 'stillpoint-engine/1.3.0';
