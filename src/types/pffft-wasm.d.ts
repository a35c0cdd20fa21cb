declare module '@echogarden/pffft-wasm/simd' {
	/**
	 * The Emscripten module of PFFFT 0.4.2 (SIMD build). Only the members the engine uses are typed;
	 * pointers are byte offsets into the module's memory. `HEAPF32` is replaced when the memory grows,
	 * so it must be read again after every allocation.
	 */
	export interface PffftModule {
		HEAPF32: Float32Array;
		_pffft_new_setup(n: number, transform: 0 | 1): number;
		_pffft_destroy_setup(setup: number): void;
		_pffft_transform_ordered(setup: number, input: number, output: number, work: number, direction: 0 | 1): void;
		_pffft_aligned_malloc(bytes: number): number;
		_pffft_aligned_free(pointer: number): void;
		_pffft_simd_size(): number;
	}
	export default function PFFFT(options?: { locateFile?: (path: string, prefix: string) => string; wasmBinary?: ArrayBuffer | Uint8Array }): Promise<PffftModule>;
}
