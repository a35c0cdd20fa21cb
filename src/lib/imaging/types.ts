import ndarray from 'ndarray';
import type { NdArray } from 'ndarray';

/** One image channel: shape [height, width], row-major, nominal range [0, 1]. */
export type Plane = NdArray<Float32Array>;

/** A decoded photograph as the engine sees it: one (grey) or three (RGB) planes. */
export interface RasterImage {
	width: number;
	height: number;
	planes: Plane[];
	transfer: 'srgb' | 'linear';
	sourceBitDepth: 8 | 16;
}

/**
 * Allocate a zero-filled plane, or wrap an existing buffer of `height·width` values.
 * @throws RangeError when the size is not a positive integer pair or the buffer length differs.
 */
export function createPlane(height: number, width: number, data?: Float32Array): Plane {
	if (!Number.isInteger(height) || !Number.isInteger(width) || height < 1 || width < 1) {
		throw new RangeError(`plane size must be positive integers, got ${height}×${width}`);
	}
	const buffer = data ?? new Float32Array(height * width);
	if (buffer.length !== height * width) {
		throw new RangeError(`plane buffer holds ${buffer.length} values, expected ${height * width}`);
	}
	return ndarray(buffer, [height, width]);
}

/**
 * Copy any 2-D ndarray view (cropped, strided, transposed) into a fresh contiguous row-major
 * Float32 plane, so numerical code can index `data[i * width + j]` directly.
 */
export function toContiguous(view: NdArray): Plane {
	if (view.shape.length !== 2) {
		throw new RangeError(`expected a 2-D array, got ${view.shape.length} dimensions`);
	}
	const [height, width] = view.shape;
	const out = createPlane(height, width);
	const data = out.data;
	for (let i = 0; i < height; i++) {
		for (let j = 0; j < width; j++) data[i * width + j] = view.get(i, j);
	}
	return out;
}

/**
 * True when the plane's values are laid out contiguously row-major from offset 0, which the
 * fast paths require; other views are copied first with {@link toContiguous}.
 */
export function isContiguous(plane: NdArray): boolean {
	const [height, width] = plane.shape;
	return (
		plane.offset === 0 &&
		plane.stride[1] === 1 &&
		plane.stride[0] === width &&
		plane.data.length === height * width
	);
}

/** Contiguous Float32 view of a plane's values, copying only when the layout requires it. */
export function planeValues(plane: Plane): Float32Array {
	return isContiguous(plane) ? plane.data : toContiguous(plane).data;
}
