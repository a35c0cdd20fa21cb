/**
 * Why an image could not be read. The command line prints `message` as its one-line error;
 * the worker (later) maps `reason` to a run failure without parsing text.
 */
export type ImageInputReason = 'unsupported' | 'corrupt' | 'too-large' | 'empty';

export class ImageInputError extends Error {
	constructor(
		readonly reason: ImageInputReason,
		message: string
	) {
		super(message);
		this.name = 'ImageInputError';
	}
}
