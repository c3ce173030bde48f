/**
 * WAV (RIFF WAVE) -> Capture: PCM 8/16/24/32-bit integer and 32/64-bit float, any channel count, decoded
 * by the wavefile package. Samples are normalised to full scale (int: x / 2^(bits−1); float as stored),
 * then multiplied by a per-channel calibration (volts or amps at full scale) when one is given, either in
 * the options or in the file's INFO comment (`ICMT`) as `sinecheck-calibration: 1=U1 V 650; 2=I1 A 200`.
 * Ref: Microsoft/IBM RIFF WAVE format, `fmt ` and `data` chunks (common practice; from memory).
 */
import * as wavefileModule from 'wavefile';
import {
	scaleRange,
	type Capture,
	type Channel,
	type ChannelRange,
	type Diagnostic,
	type Quantity,
} from '../capture.js';
import { ImportError } from './import-error.js';
import { channelPhase, normaliseUnitText, quantityFromName } from '../channel-identity.js';

/** Calibration of one WAV channel: what full scale (1.0, or the largest integer code) stands for. */
export interface WavChannelCalibration {
	/** Value at full scale in `unit` (e.g. 650 for 650 V at full scale; a clamp's 200 A range). */
	fullScale: number;
	/** 'V', 'A', 'kV', 'mA', ... (normalised to V/A) or any other text. Default ''. */
	unit?: string;
	name?: string;
	quantity?: Quantity;
	phase?: string;
}

export interface WavOptions {
	/** Calibration per channel, in channel order; missing entries leave that channel normalised. */
	channels?: (WavChannelCalibration | undefined)[];
}

interface WaveFileLike {
	fmt: { audioFormat: number; numChannels: number; sampleRate: number; bitsPerSample: number; subformat?: number[] };
	bitDepth: string;
	getSamples(interleaved?: boolean): Float64Array;
	getTag(tag: string): string | null;
}
type WaveFileCtor = new (bytes?: Uint8Array) => WaveFileLike;
// wavefile ships an ES module (named export, used by bundlers) and a UMD build (default export under Node).
const ns = wavefileModule as unknown as { WaveFile?: WaveFileCtor; default?: { WaveFile?: WaveFileCtor } };
const WaveFile = (ns.WaveFile ?? ns.default?.WaveFile) as WaveFileCtor;

const ascii = (b: Uint8Array, at: number) => String.fromCharCode(b[at], b[at + 1], b[at + 2], b[at + 3]);

/** Walk the RIFF chunks; throw 'bad-wav' with the byte offset (column = offset + 1) of what is wrong. */
function checkRiff(bytes: Uint8Array, source: string): { dataBytes: number; truncatedBy: number; isFloat: boolean } {
	const fail = (offset: number, got: string, expected: string): never => {
		throw new ImportError(source, 0, offset + 1, 'bad-wav', got, expected);
	};
	if (bytes.length < 12) fail(bytes.length, '', `a 12-byte RIFF header; the file has ${bytes.length} bytes`);
	if (ascii(bytes, 0) !== 'RIFF' && ascii(bytes, 0) !== 'RIFX')
		fail(0, ascii(bytes, 0), "'RIFF' at the start of a WAV file");
	if (ascii(bytes, 8) !== 'WAVE') fail(8, ascii(bytes, 8), "'WAVE' after the RIFF header");
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const le = ascii(bytes, 0) === 'RIFF';
	let p = 12;
	let fmtAt = -1;
	let fmtSize = 0;
	while (p + 8 <= bytes.length) {
		const id = ascii(bytes, p);
		const size = view.getUint32(p + 4, le);
		if (id === 'fmt ') {
			fmtAt = p;
			fmtSize = size;
			if (size < 16 || p + 8 + 16 > bytes.length)
				fail(p + 4, String(size), "a complete 'fmt ' chunk of at least 16 bytes");
		}
		if (id === 'data') {
			if (fmtAt < 0) fail(p, id, "a 'fmt ' chunk before the 'data' chunk");
			const format = view.getUint16(fmtAt + 8, le);
			const channels = view.getUint16(fmtAt + 10, le);
			const rate = view.getUint32(fmtAt + 12, le);
			const bits = view.getUint16(fmtAt + 22, le);
			const sub =
				format === 0xfffe && fmtSize >= 40 && fmtAt + 8 + 26 <= bytes.length
					? view.getUint16(fmtAt + 8 + 24, le)
					: format;
			if (sub !== 1 && sub !== 3)
				fail(
					fmtAt + 8,
					String(format),
					'PCM integer (format 1) or IEEE float (format 3) samples; compressed WAV is not read',
				);
			if (channels < 1) fail(fmtAt + 10, String(channels), 'at least one channel');
			if (rate < 1) fail(fmtAt + 12, String(rate), 'a sample rate above 0 Hz');
			const okBits = sub === 1 ? [8, 16, 24, 32] : [32, 64];
			if (!okBits.includes(bits))
				fail(
					fmtAt + 22,
					String(bits),
					`${okBits.join(', ')} bits per sample for ${sub === 1 ? 'integer' : 'float'} data`,
				);
			const available = bytes.length - (p + 8);
			return { dataBytes: Math.min(size, available), truncatedBy: Math.max(0, size - available), isFloat: sub === 3 };
		}
		if (p + 8 + size > bytes.length)
			fail(p + 4, `${id} ${size}`, `a '${id}' chunk that fits in the file (${bytes.length - p - 8} bytes left)`);
		p += 8 + size + (size & 1);
	}
	return fail(Math.min(p, bytes.length), '', fmtAt < 0 ? "a 'fmt ' chunk" : "a 'data' chunk");
}

/** Calibration read from the INFO comment: `sinecheck-calibration: 1=U1 V 650; 2=I1 A 200`. */
function calibrationFromComment(comment: string | null): (WavChannelCalibration | undefined)[] | undefined {
	const m = comment ? /sinecheck-calibration:\s*([^\n]*)/i.exec(comment) : null;
	if (!m) return undefined;
	const out: (WavChannelCalibration | undefined)[] = [];
	for (const part of m[1].split(';')) {
		const e = /^\s*(\d+)\s*=\s*(\S+)\s+(\S+)\s+([-+0-9.eE]+)\s*$/.exec(part);
		if (!e) continue;
		const fullScale = Number(e[4]);
		if (Number.isFinite(fullScale) && fullScale !== 0) out[Number(e[1]) - 1] = { name: e[2], unit: e[3], fullScale };
	}
	return out.length > 0 ? out : undefined;
}

/** The decoder's view of the file; its own errors become 'bad-wav'. */
function decodeWav(bytes: Uint8Array, source: string): WaveFileLike {
	try {
		return new WaveFile(bytes);
	} catch (e) {
		throw new ImportError(
			source,
			0,
			1,
			'bad-wav',
			e instanceof Error ? e.message : String(e),
			'a WAV file the decoder can read',
		);
	}
}

/** The calibration to use: the options' (checked against the channel count), else the file's INFO comment. */
function chooseCalibration(
	wav: WaveFileLike,
	options: WavOptions,
	source: string,
	diagnostics: Diagnostic[],
): (WavChannelCalibration | undefined)[] {
	const { numChannels } = wav.fmt;
	const optionCal = options.channels;
	if (optionCal && optionCal.length > numChannels) {
		throw new ImportError(
			source,
			0,
			0,
			'bad-option',
			`${optionCal.length} calibrations`,
			`at most ${numChannels} channel calibrations (the file has ${numChannels} channels)`,
		);
	}
	const fileCal = optionCal ? undefined : calibrationFromComment(safeTag(wav, 'ICMT'));
	if (fileCal)
		diagnostics.push({
			code: 'wav-calibration-from-file',
			severity: 'info',
			message: "Channel calibration taken from the file's INFO comment (sinecheck-calibration).",
		});
	return optionCal ?? fileCal ?? [];
}

/** Unsigned 8-bit PCM is centred on 128; wider integers are signed, full scale 2^(bits−1). Ref: RIFF WAVE (common practice). */
const PCM8_CENTRE = 128;

/** How interleaved codes become full-scale fractions: value = scaleIn · (x − shift). */
function codeScale(isFloat: boolean, bitsPerSample: number): { scaleIn: number; shift: number } {
	const pcm8 = !isFloat && bitsPerSample === 8;
	return {
		scaleIn: isFloat ? 1 : pcm8 ? 1 / PCM8_CENTRE : 1 / 2 ** (bitsPerSample - 1),
		shift: pcm8 ? PCM8_CENTRE : 0,
	};
}

/** Channel `c` taken out of the interleaved frames and scaled by its calibration (or left normalised). */
function wavChannel(
	interleaved: Float64Array,
	c: number,
	frames: number,
	numChannels: number,
	code: { scaleIn: number; shift: number },
	cal: WavChannelCalibration | undefined,
	source: string,
): Channel {
	if (cal && !(Number.isFinite(cal.fullScale) && cal.fullScale !== 0)) {
		throw new ImportError(
			source,
			0,
			0,
			'bad-option',
			String(cal.fullScale),
			`a non-zero full-scale value for channel ${c + 1}`,
		);
	}
	const u = normaliseUnitText(cal?.unit ?? '');
	const name = cal?.name ?? `ch${c + 1}`;
	const factor = cal ? cal.fullScale * u.factor * code.scaleIn : code.scaleIn;
	const offset = -code.shift * factor;
	const samples = new Float64Array(frames);
	for (let k = 0, j = c; k < frames; k++, j += numChannels) samples[k] = factor * interleaved[j] + offset;
	const quantity =
		cal?.quantity ?? (u.quantity !== 'other' ? u.quantity : cal ? (quantityFromName(name) ?? 'other') : 'other');
	const ch: Channel = {
		name,
		unit: u.unit,
		quantity,
		samples,
		scaling: {
			factor,
			offset,
			description: cal
				? `${cal.fullScale} ${cal.unit ?? ''} at full scale`
				: 'normalised to full scale (no calibration)',
		},
	};
	const ph = cal ? channelPhase(name, cal.phase) : undefined;
	if (ph) ch.phase = ph;
	return ch;
}

/** The file's format and the INFO tags worth keeping. */
function wavMetadata(wav: WaveFileLike): Record<string, string> {
	const metadata: Record<string, string> = {
		'wav.channels': String(wav.fmt.numChannels),
		'wav.sampleRateHz': String(wav.fmt.sampleRate),
		'wav.bitDepth': wav.bitDepth,
	};
	for (const tag of ['INAM', 'ICMT', 'ICRD', 'ISFT']) {
		const v = safeTag(wav, tag);
		if (v) metadata[`wav.${tag}`] = v;
	}
	return metadata;
}

/**
 * Read a WAV file.
 *
 * value = fullScale · x / 2^(bits−1) for integer samples (8-bit: (x − 128)/128), fullScale · x for float samples.
 *
 * @param bytes  the whole file
 * @param source  the file name, for errors and the capture
 * @param options  per-channel calibration; without one (here or in the file) a channel stays normalised
 *   (−1 … 1, unit '', quantity 'other') and an 'assumption' diagnostic says so
 * @throws ImportError 'bad-wav' (line 0, column = byte offset + 1), 'bad-option'
 * @example parseWav(bytes, 'clamp.wav', { channels: [{ fullScale: 650, unit: 'V', name: 'U1' }] }).channels[0].unit // 'V'
 */
export function parseWav(bytes: Uint8Array, source: string, options: WavOptions = {}): Capture {
	const { dataBytes, truncatedBy, isFloat } = checkRiff(bytes, source);
	const wav = decodeWav(bytes, source);
	const { numChannels, sampleRate, bitsPerSample } = wav.fmt;
	const diagnostics: Diagnostic[] = [
		{
			code: 'wav-format',
			severity: 'info',
			message: `WAV: ${numChannels} channel(s), ${sampleRate} Hz, ${bitsPerSample}-bit ${isFloat ? 'float' : 'integer'} samples${isFloat ? '' : "; full scale is each channel's range, so flat runs at it are taken as clipping"}.`,
		},
	];
	const blockBytes = (numChannels * bitsPerSample) / 8;
	const frames = Math.floor(dataBytes / blockBytes);
	if (truncatedBy > 0)
		diagnostics.push({
			code: 'wav-truncated',
			severity: 'warning',
			message: `The data chunk is ${truncatedBy} bytes shorter than its header says; the ${frames} whole sample frames present are read.`,
		});
	const calibration = chooseCalibration(wav, options, source, diagnostics);
	const interleaved = wav.getSamples(true);
	const code = codeScale(isFloat, bitsPerSample);
	const channels: Channel[] = [];
	const uncalibrated: string[] = [];
	for (let c = 0; c < numChannels; c++) {
		const cal = calibration[c];
		const ch = wavChannel(interleaved, c, frames, numChannels, code, cal, source);
		if (!isFloat && ch.scaling) ch.range = fullScaleRange(bitsPerSample, ch.scaling.factor, ch.scaling.offset);
		if (!cal) uncalibrated.push(ch.name);
		else
			diagnostics.push({
				code: 'wav-calibration',
				severity: 'info',
				message: `Channel ${c + 1} (${ch.name}): full scale = ${cal.fullScale} ${cal.unit ?? ''}.`,
			});
		channels.push(ch);
	}
	if (uncalibrated.length > 0) {
		diagnostics.push({
			code: 'wav-uncalibrated',
			severity: 'assumption',
			message: `No calibration for ${uncalibrated.join(', ')}: samples are left as fractions of full scale (−1 … 1), unit '' and quantity 'other'. Give volts or amps at full scale to get real values.`,
		});
	}
	return { source, sampleRateHz: sampleRate, startS: 0, channels, metadata: wavMetadata(wav), diagnostics };
}

/** An integer converter cannot give a value beyond its codes: full scale is the channel's range (8-bit codes 0 … 255 around 128). */
function fullScaleRange(bits: number, factor: number, offset: number): ChannelRange {
	const top = 2 ** (bits - 1);
	const raw = bits === 8 ? { min: 0, max: 255 } : { min: -top, max: top - 1 };
	return scaleRange({ ...raw, source: `the ${bits}-bit WAV's full scale` }, factor, offset);
}

function safeTag(wav: WaveFileLike, tag: string): string | null {
	try {
		return wav.getTag(tag);
	} catch {
		return null;
	}
}
