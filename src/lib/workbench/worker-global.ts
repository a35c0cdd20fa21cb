/**
 * typedarray-pool (under ndarray-fft, the engine's FFT for non-power-of-two sizes) keeps its pool
 * on Node's `global`, which a Web Worker lacks. Imported first by the worker so it runs before it.
 */
const scope = globalThis as typeof globalThis & { global?: typeof globalThis };
scope.global ??= globalThis;
