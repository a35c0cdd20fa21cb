import { createPlane, type Plane } from '../types';

/** A rectangle of a plane in pixel coordinates: x to the right, y down, from the top-left pixel. */
export interface Region {
	x: number;
	y: number;
	width: number;
	height: number;
}

/**
 * Check that a region is a non-empty integer rectangle inside a height × width plane.
 * @throws RangeError naming the region and the image size otherwise.
 */
export function assertRegion(region: Region, height: number, width: number): void {
	const r = region;
	const ints = [r.x, r.y, r.width, r.height].every(Number.isInteger);
	if (!ints || r.width < 1 || r.height < 1 || r.x < 0 || r.y < 0 || r.x + r.width > width || r.y + r.height > height) {
		throw new RangeError(
			`region ${r.width}×${r.height} at (${r.x}, ${r.y}) must be a non-empty integer rectangle inside the ${width}×${height} image`
		);
	}
}

/**
 * The region as an ndarray view of the plane (no copy; ndarray lo/hi), for readers that honour
 * strides such as averagedPowerSpectrum.
 * @throws RangeError when the region is not inside the plane.
 */
export function regionView(plane: Plane, region: Region): Plane {
	assertRegion(region, plane.shape[0], plane.shape[1]);
	return plane.lo(region.y, region.x).hi(region.height, region.width);
}

/**
 * Copy a rectangle of a plane into a fresh contiguous plane (the whole plane when no region is
 * given), so the estimators can index `data[i * width + j]`.
 * @throws RangeError when the region is not a non-empty integer rectangle inside the plane.
 */
export function cropRegion(plane: Plane, region?: Region): Plane {
	const [height, width] = plane.shape;
	const r = region ?? { x: 0, y: 0, width, height };
	assertRegion(r, height, width);
	const out = createPlane(r.height, r.width);
	const [s0, s1] = plane.stride;
	const src = plane.data;
	for (let i = 0; i < r.height; i++) {
		const base = plane.offset + (r.y + i) * s0 + r.x * s1;
		const row = i * r.width;
		if (s1 === 1) out.data.set(src.subarray(base, base + r.width), row);
		else for (let j = 0; j < r.width; j++) out.data[row + j] = src[base + j * s1];
	}
	return out;
}
