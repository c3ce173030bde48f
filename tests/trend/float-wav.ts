/**
 * Writes a 32-bit float WAV (format 3) in blocks, for tests and the bench: values are stored as they
 * are (V or A) and an INFO comment carries lib/io's calibration syntax with full scale 1, so the reader
 * gives them back in V and A. Layout: RIFF/WAVE, 'fmt ' (16 bytes), 'LIST'/'INFO'/'ICMT', 'data'.
 * Ref: Microsoft/IBM RIFF WAVE format (common practice; from memory).
 */
import { closeSync, openSync, writeSync } from 'node:fs';

export interface FloatWavChannel {
	name: string;
	unit: 'V' | 'A';
}

export class FloatWavWriter {
	private readonly fd: number;
	private framesWritten = 0;
	private readonly dataAt: number;
	private buf = Buffer.alloc(0);

	constructor(
		path: string,
		private readonly channels: FloatWavChannel[],
		sampleRateHz: number,
		private readonly totalFrames: number,
	) {
		const n = channels.length;
		const comment = Buffer.from(
			`sinecheck-calibration: ${channels.map((c, i) => `${i + 1}=${c.name} ${c.unit} 1`).join('; ')}\0`,
			'latin1',
		);
		const icmt = Buffer.concat([Buffer.from('ICMT'), u32(comment.length), comment, Buffer.alloc(comment.length & 1)]);
		const list = Buffer.concat([Buffer.from('LIST'), u32(4 + icmt.length), Buffer.from('INFO'), icmt]);
		const fmt = Buffer.alloc(24);
		fmt.write('fmt ', 0, 'latin1');
		fmt.writeUInt32LE(16, 4);
		fmt.writeUInt16LE(3, 8);
		fmt.writeUInt16LE(n, 10);
		fmt.writeUInt32LE(sampleRateHz, 12);
		fmt.writeUInt32LE(sampleRateHz * n * 4, 16);
		fmt.writeUInt16LE(n * 4, 20);
		fmt.writeUInt16LE(32, 22);
		const dataBytes = totalFrames * n * 4;
		const head = Buffer.concat([
			Buffer.from('RIFF'),
			u32(4 + fmt.length + list.length + 8 + dataBytes),
			Buffer.from('WAVE'),
			fmt,
			list,
			Buffer.from('data'),
			u32(dataBytes),
		]);
		this.fd = openSync(path, 'w');
		writeSync(this.fd, head);
		this.dataAt = head.length;
	}

	/** Appends frames: one array per channel, all the same length. */
	write(block: ArrayLike<number>[]): void {
		const n = this.channels.length;
		const frames = block[0].length;
		if (this.buf.length < frames * n * 4) this.buf = Buffer.allocUnsafeSlow(frames * n * 4);
		const f = new Float32Array(this.buf.buffer, this.buf.byteOffset, frames * n);
		for (let c = 0; c < n; c++) {
			const x = block[c];
			for (let k = 0, j = c; k < frames; k++, j += n) f[j] = x[k];
		}
		writeSync(this.fd, this.buf, 0, frames * n * 4, this.dataAt + this.framesWritten * n * 4);
		this.framesWritten += frames;
	}

	close(): void {
		if (this.framesWritten !== this.totalFrames)
			throw new Error(`wrote ${this.framesWritten} frames, header says ${this.totalFrames}`);
		closeSync(this.fd);
	}
}

function u32(x: number): Buffer {
	const b = Buffer.alloc(4);
	b.writeUInt32LE(x, 0);
	return b;
}
