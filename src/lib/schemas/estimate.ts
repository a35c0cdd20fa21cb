/**
 * A blur-estimation request, `{region?}`: the rectangle of the original to read the blur from, in
 * the original's pixels (x right, y down). Whether it lies inside the image is checked against the
 * item's size by the service, which knows it.
 */
import { z } from 'zod';

const coordinate = (what: string) => z.int({ error: `region ${what} must be an integer` }).min(0, { error: `region ${what} must be ≥ 0` });
const side = (what: string) => z.int({ error: `region ${what} must be an integer` }).min(1, { error: `region ${what} must be ≥ 1` });

export const estimateRequestSchema = z.strictObject({
	region: z
		.strictObject({ x: coordinate('x'), y: coordinate('y'), width: side('width'), height: side('height') })
		.optional()
});

export type EstimateRequest = z.infer<typeof estimateRequestSchema>;
