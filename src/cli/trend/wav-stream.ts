/**
 * Streams the sample frames of a WAV file from disk in fixed-size blocks, so a recording of hours never
 * sits whole in memory. The header is read here (RIFF chunk walk); channel names, units and calibration
 * come from lib/io's parseWav run on a miniature copy of the file (its header chunks and one frame), so
 * the values are exactly those the whole-file reader would give.
 * Ref: Microsoft/IBM RIFF WAVE format, 'fmt ' and 'data' chunks (common practice; from memory).
 */
import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import type { Capture } from '../../../lib/capture.js';
import { ImportError } from '../../../lib/io/index.js';
import { applyImportSettings, type ImportSettings } from '../../../lib/io/index.js';
import { detectFileKind } from '../../../lib/io/index.js';
import { parseWav, type WavOptions } from '../../../lib/io/index.js';

export interface WavStream {
	/** Channel names, units, quantities, scaling and diagnostics (samples hold one frame only). */
	header: Capture;
	sampleRateHz: number;
	channelCount: number;
	/** Whole frames in the data chunk (per channel sample count). */
	frames: number;
	/** Reads up to out[0].length frames into `out` (one array per channel, scaled); returns frames read, 0 at the end. */
	read(out: Float64Array[]): number;
	close(): void;
}

const HEAD_BYTES = 1 << 16;

function ascii(b: Uint8Array, at: number): string {
	return String.fromCharCode(b[at], b[at + 1], b[at + 2], b[at + 3]);
}

/**
 * Opens a WAV file for streaming; the import settings (scale, unit, quantity, rate) are applied as
 * lib/io applies them to a whole WAV capture, so the streamed values and diagnostics are the same.
 * @throws ImportError 'bad-wav' (line 0, column = byte offset + 1) as parseWav does; 'bad-option' from the settings
 */
export function openWavStream(
	path: string,
	source: string,
	options: WavOptions = {},
	frameBlock = 65_536,
	settings?: ImportSettings,
): WavStream {
	const fd = openSync(path, 'r');
	try {
		const size = fstatSync(fd).size;
		const head = Buffer.alloc(Math.min(size, HEAD_BYTES));
		readSync(fd, head, 0, head.length, 0);
		if (head.length < 12 || detectFileKind('', head).kind !== 'wav')
			throw new ImportError(
				source,
				0,
				1,
				'bad-wav',
				head.subarray(0, 4).toString('latin1'),
				"'RIFF' ... 'WAVE' at the start of a WAV file",
			);
		if (ascii(head, 0) === 'RIFX')
			throw new ImportError(
				source,
				0,
				1,
				'bad-wav',
				'RIFX',
				'a little-endian RIFF file for streaming (big-endian RIFX is not streamed)',
			);
		// Walk the chunks up to 'data' in the head; chunks after the data (often LIST/INFO) are read from the tail.
		let p = 12;
		let fmt: { format: number; channels: number; rate: number; bits: number } | undefined;
		let dataAt = -1;
		let dataSize = 0;
		while (p + 8 <= head.length) {
			const id = ascii(head, p);
			const len = head.readUInt32LE(p + 4);
			if (id === 'fmt ') {
				if (p + 8 + 16 > head.length) break;
				const f = head.readUInt16LE(p + 8);
				const sub = f === 0xfffe && len >= 40 && p + 8 + 26 <= head.length ? head.readUInt16LE(p + 8 + 24) : f;
				fmt = {
					format: sub,
					channels: head.readUInt16LE(p + 10),
					rate: head.readUInt32LE(p + 12),
					bits: head.readUInt16LE(p + 22),
				};
			}
			if (id === 'data') {
				dataAt = p + 8;
				dataSize = Math.min(len, size - dataAt);
				break;
			}
			p += 8 + len + (len & 1);
		}
		if (!fmt || dataAt < 0) {
			// Let the whole-file reader name exactly what is wrong (it reads only the head here).
			parseWav(new Uint8Array(head), source, options);
			throw new ImportError(
				source,
				0,
				Math.min(p, head.length) + 1,
				'bad-wav',
				'',
				"'fmt ' and 'data' chunks within the first 64 KiB",
			);
		}
		const blockBytes = (fmt.channels * fmt.bits) / 8;
		const frames = Math.floor(dataSize / blockBytes);
		const dataEnd = dataAt + dataSize + (dataSize & 1);
		const tailRead = Buffer.alloc(Math.max(0, Math.min(size - dataEnd, 1 << 20)));
		if (tailRead.length > 0) readSync(fd, tailRead, 0, tailRead.length, dataEnd);
		// Keep only whole chunks from the tail (trailing padding or junk would upset the header reader).
		let q = 0;
		while (q + 8 <= tailRead.length && /^[\x20-\x7e]{4}$/.test(ascii(tailRead, q))) {
			const len = tailRead.readUInt32LE(q + 4);
			if (q + 8 + len > tailRead.length) break;
			q += 8 + len + (len & 1);
		}
		const tail = tailRead.subarray(0, Math.min(q, tailRead.length));
		const firstFrame = Buffer.alloc(Math.min(blockBytes, dataSize));
		readSync(fd, firstFrame, 0, firstFrame.length, dataAt);
		const dataHeader = Buffer.alloc(8);
		dataHeader.write('data', 0, 'latin1');
		dataHeader.writeUInt32LE(firstFrame.length, 4);
		const mini = Buffer.concat([
			head.subarray(0, dataAt - 8),
			tail,
			dataHeader,
			firstFrame,
			Buffer.alloc(firstFrame.length & 1),
		]);
		mini.writeUInt32LE(mini.length - 8, 4);
		const read = parseWav(new Uint8Array(mini.buffer, mini.byteOffset, mini.length), source, options);
		const header = settings ? applyImportSettings({ ...read, format: 'wav' }, settings) : read;
		if (dataAt + head.readUInt32LE(dataAt - 4) > size) {
			header.diagnostics.push({
				code: 'wav-truncated',
				severity: 'warning',
				message: `The data chunk is shorter than its header says; the ${frames} whole sample frames present are read.`,
			});
		}
		const factors = header.channels.map((c) => c.scaling?.factor ?? 1);
		const offsets = header.channels.map((c) => c.scaling?.offset ?? 0);
		const isFloat = fmt.format === 3;
		const bytesPerSample = fmt.bits / 8;
		const nCh = fmt.channels;
		const buf = Buffer.allocUnsafeSlow(frameBlock * blockBytes);
		const f32 = new Float32Array(buf.buffer, buf.byteOffset, buf.length >> 2);
		const f64 = new Float64Array(buf.buffer, buf.byteOffset, buf.length >> 3);
		const i16 = new Int16Array(buf.buffer, buf.byteOffset, buf.length >> 1);
		const i32 = new Int32Array(buf.buffer, buf.byteOffset, buf.length >> 2);
		let frame = 0;
		let open = true;
		return {
			header,
			sampleRateHz: header.sampleRateHz,
			channelCount: nCh,
			frames,
			read(out: Float64Array[]): number {
				const want = Math.min(out[0].length, frameBlock, frames - frame);
				if (want <= 0) return 0;
				const bytes = want * blockBytes;
				let got = 0;
				while (got < bytes) {
					const r = readSync(fd, buf, got, bytes - got, dataAt + frame * blockBytes + got);
					if (r === 0) break;
					got += r;
				}
				const n = Math.floor(got / blockBytes);
				for (let c = 0; c < nCh; c++) {
					const o = out[c];
					const a = factors[c];
					const b = offsets[c];
					if (isFloat && bytesPerSample === 4) for (let k = 0, j = c; k < n; k++, j += nCh) o[k] = a * f32[j] + b;
					else if (isFloat) for (let k = 0, j = c; k < n; k++, j += nCh) o[k] = a * f64[j] + b;
					else if (bytesPerSample === 2) for (let k = 0, j = c; k < n; k++, j += nCh) o[k] = a * i16[j] + b;
					else if (bytesPerSample === 4) for (let k = 0, j = c; k < n; k++, j += nCh) o[k] = a * i32[j] + b;
					else if (bytesPerSample === 1) for (let k = 0, j = c; k < n; k++, j += nCh) o[k] = a * buf[j] + b;
					else {
						for (let k = 0, j = 3 * c; k < n; k++, j += 3 * nCh)
							o[k] = a * (((buf[j] | (buf[j + 1] << 8) | (buf[j + 2] << 16)) << 8) >> 8) + b;
					}
				}
				frame += n;
				return n;
			},
			close(): void {
				if (open) closeSync(fd);
				open = false;
			},
		};
	} catch (e) {
		closeSync(fd);
		throw e;
	}
}
