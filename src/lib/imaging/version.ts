/**
 * Identifies the numerical engine in every run record. Bump it whenever output bytes could change
 * (kernel rasterisation, FFT backend arithmetic, defaults, auto-mode rules), so a replay with the
 * same version is expected to reproduce the result bit for bit.
 */
export const ENGINE_VERSION = 'stillpoint-engine/1.0.0';
