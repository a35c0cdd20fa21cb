/**
 * A pass-through stream that digests what flows through it: SHA-256 (FIPS 180-4) as the fixity
 * digest and MD5 (RFC 1321) as the legacy second digest that PREMIS 3.0 suggests for exchange,
 * in the same pass as the write, so a 200 MB original is read once. It also counts the bytes and
 * keeps the first few for recognising the type by content.
 */
import { createHash, type Hash } from 'node:crypto';
import { Transform, type TransformCallback } from 'node:stream';

export interface Digests {
	sha256: string;
	md5: string;
	size: number;
	/** The first `headBytes` bytes (fewer for a shorter stream). */
	head: Buffer;
}

export class HashingStream extends Transform {
	private readonly sha256: Hash = createHash('sha256');
	private readonly md5: Hash = createHash('md5');
	private readonly headChunks: Buffer[] = [];
	private headLength = 0;
	private size = 0;
	private result: Digests | undefined;

	/** @param headBytes how many leading bytes to keep; @default 16 */
	constructor(private readonly headBytes = 16) {
		super();
	}

	override _transform(chunk: Buffer, _encoding: BufferEncoding, done: TransformCallback): void {
		this.size += chunk.length;
		if (this.headLength < this.headBytes) {
			const part = chunk.subarray(0, this.headBytes - this.headLength);
			this.headChunks.push(part);
			this.headLength += part.length;
		}
		this.sha256.update(chunk);
		this.md5.update(chunk);
		done(null, chunk);
	}

	override _flush(done: TransformCallback): void {
		this.result = {
			sha256: this.sha256.digest('hex'),
			md5: this.md5.digest('hex'),
			size: this.size,
			head: Buffer.concat(this.headChunks)
		};
		done();
	}

	/** The digests of everything that passed; only once the input has ended. */
	digests(): Digests {
		if (!this.result) throw new Error('the stream has not ended: digests are not final');
		return this.result;
	}
}
