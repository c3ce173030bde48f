/**
 * A small WAV writer for the demo captures: IEEE float 32-bit samples (format 3), any channel count, and a
 * LIST/INFO chunk with a name (INAM) and a comment (ICMT). Little-endian RIFF, chunks padded to even sizes.
 * Ref: RIFF WAVE layout, 'fmt ', 'LIST'/'INFO' and 'data' chunks (common practice; from memory).
 */

function infoChunk(tags: Record<string, string>): Uint8Array {
	const enc = new TextEncoder();
	const parts: Uint8Array[] = [];
	for (const [id, text] of Object.entries(tags)) {
		const body = enc.encode(text + '\0');
		const padded = new Uint8Array(8 + body.length + (body.length & 1));
		padded.set(enc.encode(id), 0);
		new DataView(padded.buffer).setUint32(4, body.length, true);
		padded.set(body, 8);
		parts.push(padded);
	}
	const size = 4 + parts.reduce((s, p) => s + p.length, 0);
	const out = new Uint8Array(8 + size);
	out.set(enc.encode('LIST'), 0);
	new DataView(out.buffer).setUint32(4, size, true);
	out.set(enc.encode('INFO'), 8);
	let p = 12;
	for (const part of parts) {
		out.set(part, p);
		p += part.length;
	}
	return out;
}

/** Channels of equal length, values already as fractions of full scale (−1 … 1). */
export function wavFloat32Bytes(
	channels: ArrayLike<number>[],
	sampleRateHz: number,
	tags: Record<string, string> = {},
): Uint8Array {
	const nCh = channels.length;
	const frames = channels[0].length;
	const dataBytes = frames * nCh * 4;
	const info = Object.keys(tags).length > 0 ? infoChunk(tags) : new Uint8Array(0);
	const total = 12 + 24 + info.length + 8 + dataBytes;
	const out = new Uint8Array(total);
	const v = new DataView(out.buffer);
	const put = (at: number, s: string) => out.set(new TextEncoder().encode(s), at);
	put(0, 'RIFF');
	v.setUint32(4, total - 8, true);
	put(8, 'WAVE');
	put(12, 'fmt ');
	v.setUint32(16, 16, true);
	v.setUint16(20, 3, true); // IEEE float
	v.setUint16(22, nCh, true);
	v.setUint32(24, sampleRateHz, true);
	v.setUint32(28, sampleRateHz * nCh * 4, true);
	v.setUint16(32, nCh * 4, true);
	v.setUint16(34, 32, true);
	out.set(info, 36);
	let p = 36 + info.length;
	put(p, 'data');
	v.setUint32(p + 4, dataBytes, true);
	p += 8;
	for (let k = 0; k < frames; k++) {
		for (let c = 0; c < nCh; c++, p += 4) v.setFloat32(p, channels[c][k], true);
	}
	return out;
}
