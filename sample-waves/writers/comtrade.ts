/**
 * A small COMTRADE writer (IEEE C37.111-1999/2013 layout, from memory) for the demo captures and the
 * tests: engineering values in, raw codes out (x = round((value − b)/a)), .cfg text plus .dat bytes in
 * ASCII, BINARY (int16), BINARY32 (int32) or FLOAT32, or one .cff file.
 */

export interface WriterAnalog {
	name: string;
	phase?: string;
	circuit?: string;
	unit: string;
	/** Values in `unit` as the file should hold them (primary or secondary, as `ps` says). */
	values: ArrayLike<number>;
	/** Multiplier a; default: full scale of the raw type over the largest |value|. */
	a?: number;
	b?: number;
	primary?: number;
	secondary?: number;
	ps?: 'P' | 'S';
}

export interface WriterDigital {
	name: string;
	normalState?: 0 | 1;
	states: ArrayLike<number>;
}

export interface WriterSpec {
	station: string;
	device: string;
	revYear: 1999 | 2013;
	lineFrequencyHz: number;
	/** Sampling rates with the last sample number of each; [] writes nrates = 0 (time stamps only). */
	rates: { sampleRateHz: number; endSample: number }[];
	/** Time stamp per sample in µs (before timemult); default from the rates. */
	stampsUs?: ArrayLike<number>;
	firstData: string; // 'dd/mm/yyyy,hh:mm:ss.ssssss'
	trigger: string;
	fileType: 'ASCII' | 'BINARY' | 'BINARY32' | 'FLOAT32';
	timeMult?: number;
	analog: WriterAnalog[];
	digital?: WriterDigital[];
	lineEnd?: '\r\n' | '\n';
}

const FULL = { ASCII: 99998, BINARY: 32767, BINARY32: 2147483647, FLOAT32: 1 };

function multiplier(spec: WriterSpec, a: WriterAnalog): number {
	if (a.a !== undefined) return a.a;
	if (spec.fileType === 'FLOAT32') return 1;
	let peak = 0;
	for (let i = 0; i < a.values.length; i++) peak = Math.max(peak, Math.abs(a.values[i] - (a.b ?? 0)));
	return peak > 0 ? peak / (FULL[spec.fileType] * 0.95) : 1;
}

function sampleCount(spec: WriterSpec): number {
	return spec.analog[0]?.values.length ?? spec.digital?.[0]?.states.length ?? 0;
}

/** The .cfg text. */
export function comtradeCfgText(spec: WriterSpec): string {
	const eol = spec.lineEnd ?? '\r\n';
	const dig = spec.digital ?? [];
	const n = sampleCount(spec);
	const lines = [
		`${spec.station},${spec.device},${spec.revYear}`,
		`${spec.analog.length + dig.length},${spec.analog.length}A,${dig.length}D`,
	];
	const range =
		spec.fileType === 'ASCII'
			? '-99999,99998'
			: spec.fileType === 'BINARY'
				? '-32767,32767'
				: spec.fileType === 'BINARY32'
					? '-2147483647,2147483647'
					: '-3.4e38,3.4e38';
	spec.analog.forEach((a, i) => {
		lines.push(
			`${i + 1},${a.name},${a.phase ?? ''},${a.circuit ?? ''},${a.unit},${multiplier(spec, a)},${a.b ?? 0},0,${range},${a.primary ?? 1},${a.secondary ?? 1},${a.ps ?? 'P'}`,
		);
	});
	dig.forEach((d, i) => lines.push(`${i + 1},${d.name},,,${d.normalState ?? 0}`));
	lines.push(String(spec.lineFrequencyHz));
	lines.push(String(spec.rates.length));
	if (spec.rates.length === 0) lines.push(`0,${n}`);
	for (const r of spec.rates) lines.push(`${r.sampleRateHz},${r.endSample}`);
	lines.push(
		spec.firstData,
		spec.trigger,
		spec.fileType.toLowerCase() === 'float32' ? 'FLOAT32' : spec.fileType,
		String(spec.timeMult ?? 1),
	);
	if (spec.revYear === 2013) lines.push('0,0', '0,0');
	return lines.join(eol) + eol;
}

function stamps(spec: WriterSpec, n: number): Float64Array {
	const out = new Float64Array(n);
	if (spec.stampsUs) {
		for (let i = 0; i < n; i++) out[i] = spec.stampsUs[i];
		return out;
	}
	let t = 0;
	let seg = 0;
	for (let k = 0; k < n; k++) {
		while (seg < spec.rates.length - 1 && k + 1 > spec.rates[seg].endSample) seg++;
		if (k > 0) t += 1e6 / spec.rates[seg].sampleRateHz;
		out[k] = Math.round(t / (spec.timeMult ?? 1));
	}
	return out;
}

/** Raw code of a value; NaN values are written as the format's missing-value marker. */
function rawCodes(spec: WriterSpec, a: WriterAnalog): Float64Array {
	const mult = multiplier(spec, a);
	const out = new Float64Array(a.values.length);
	const missing =
		spec.fileType === 'ASCII'
			? 99999
			: spec.fileType === 'BINARY'
				? -32768
				: spec.fileType === 'BINARY32'
					? -2147483648
					: NaN;
	for (let i = 0; i < out.length; i++) {
		const v = a.values[i];
		out[i] = Number.isNaN(v)
			? missing
			: spec.fileType === 'FLOAT32'
				? (v - (a.b ?? 0)) / mult
				: Math.round((v - (a.b ?? 0)) / mult);
	}
	return out;
}

/** The .dat bytes. */
export function comtradeDatBytes(spec: WriterSpec): Uint8Array {
	const n = sampleCount(spec);
	const dig = spec.digital ?? [];
	const codes = spec.analog.map((a) => rawCodes(spec, a));
	const ts = stamps(spec, n);
	if (spec.fileType === 'ASCII') {
		const eol = spec.lineEnd ?? '\r\n';
		const parts: string[] = [];
		for (let k = 0; k < n; k++) {
			const row = [String(k + 1), String(ts[k])];
			for (const c of codes) row.push(String(c[k]));
			for (const d of dig) row.push(d.states[k] ? '1' : '0');
			parts.push(row.join(','));
		}
		return new TextEncoder().encode(parts.join(eol) + eol);
	}
	const width = spec.fileType === 'BINARY' ? 2 : 4;
	const words = Math.ceil(dig.length / 16);
	const record = 8 + width * codes.length + 2 * words;
	const out = new Uint8Array(record * n);
	const view = new DataView(out.buffer);
	for (let k = 0; k < n; k++) {
		let p = k * record;
		view.setUint32(p, k + 1, true);
		view.setUint32(p + 4, ts[k] >>> 0, true);
		p += 8;
		for (const c of codes) {
			if (spec.fileType === 'BINARY') view.setInt16(p, c[k], true);
			else if (spec.fileType === 'BINARY32') view.setInt32(p, c[k], true);
			else view.setFloat32(p, c[k], true);
			p += width;
		}
		for (let w = 0; w < words; w++) {
			let word = 0;
			for (let b = 0; b < 16 && 16 * w + b < dig.length; b++) if (dig[16 * w + b].states[k]) word |= 1 << b;
			view.setUint16(p + 2 * w, word, true);
		}
	}
	return out;
}

/** One .cff file: CFG, INF, HDR and DAT sections. */
export function comtradeCffBytes(spec: WriterSpec, hdrText = ''): Uint8Array {
	const eol = spec.lineEnd ?? '\r\n';
	const dat = comtradeDatBytes(spec);
	const datHeader =
		spec.fileType === 'ASCII'
			? `--- file type: DAT ASCII ---`
			: `--- file type: DAT ${spec.fileType}: ${dat.length} ---`;
	const head = `--- file type: CFG ---${eol}${comtradeCfgText(spec)}--- file type: INF ---${eol}--- file type: HDR ---${eol}${hdrText ? hdrText + eol : ''}${datHeader}${eol}`;
	const headBytes = new TextEncoder().encode(head);
	const out = new Uint8Array(headBytes.length + dat.length);
	out.set(headBytes, 0);
	out.set(dat, headBytes.length);
	return out;
}
