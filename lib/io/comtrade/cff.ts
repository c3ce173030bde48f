/**
 * COMTRADE 2013 single-file format (.cff): CFG, INF, HDR and DAT sections, each introduced by a line
 * `--- file type: CFG ---`, ..., `--- file type: DAT ASCII ---` or `--- file type: DAT BINARY: <bytes> ---`.
 * Ref: IEC 60255-24:2013 / IEEE C37.111-2013, combined file format (from memory; section lines as in
 * the public sample files listed in docs/methods.md §8.3).
 */
import type { Capture } from '../../capture.js';
import { ImportError } from '../import-error.js';
import { parseComtradeCfg, type ComtradeConfig } from './cfg.js';
import { buildCapture, type ComtradeOptions } from './parse.js';
import { decodeText } from './text.js';

export interface CffSection {
	type: string;
	/** Declared byte count (binary DAT), when given. */
	declaredBytes?: number;
	/** 1-based line of the section's header line. */
	headerLine: number;
	/** Byte offset of the first byte after the header line. */
	start: number;
	/** Byte offset just past the section. */
	end: number;
}

const HEADER = /^---\s*file type:\s*([A-Za-z]+(?:\s+[A-Za-z0-9]+)?)\s*(?::\s*(\d+)\s*)?---\s*$/i;

/** Where the parts of a .cff are: its sections, the parsed CFG, and the DAT bytes [start, end). */
export interface CffLayout {
	sections: CffSection[];
	cfg: ComtradeConfig;
	dat: { start: number; end: number; headerLine: number };
}

/**
 * The sections of a .cff up to its DAT section header, from the head of the file (the DAT section runs to
 * its declared byte count or to the end of the file, `totalBytes`), with the CFG parsed.
 * @param head  the file, or its first bytes as long as they hold the DAT section's header line
 * @throws ImportError 'cfg-syntax' when the CFG or DAT section is missing or of the wrong type,
 *   'dat-too-short' when the file ends before the declared data bytes
 * @example cffLayout(bytes, 'relay.cff', bytes.length).dat.start // byte offset of the first data byte
 */
export function cffLayout(head: Uint8Array, source: string, totalBytes: number): CffLayout {
	// Windows-1252 decoding maps each byte to one character, so string indices are byte offsets.
	const text = new TextDecoder('latin1').decode(head);
	const sections: CffSection[] = [];
	let pos = 0;
	let line = 1;
	while (pos < text.length) {
		let eol = text.indexOf('\n', pos);
		if (eol < 0) eol = text.length;
		const lineText = text.slice(pos, eol).replace(/\r$/, '');
		const m = lineText.startsWith('---') ? HEADER.exec(lineText) : null;
		if (m) {
			if (sections.length > 0) sections[sections.length - 1].end = pos;
			const type = m[1].toUpperCase().replace(/\s+/g, ' ');
			sections.push({
				type,
				declaredBytes: m[2] !== undefined ? Number(m[2]) : undefined,
				headerLine: line,
				start: Math.min(eol + 1, text.length),
				end: totalBytes,
			});
			if (type.startsWith('DAT')) break; // the data section runs to its byte count or the end: no more headers
		} else if (sections.length === 0 && lineText.trim() !== '') {
			throw new ImportError(source, line, 1, 'cfg-syntax', lineText, 'the first section line `--- file type: CFG ---`');
		}
		pos = eol + 1;
		line++;
	}
	const cfgSection = sections.find((s) => s.type === 'CFG');
	const datSection = sections.find((s) => s.type.startsWith('DAT'));
	if (!cfgSection)
		throw new ImportError(source, 1, 1, 'cfg-syntax', text.slice(0, 40), 'a `--- file type: CFG ---` section');
	if (!datSection)
		throw new ImportError(
			source,
			line,
			0,
			'cfg-syntax',
			'',
			'a `--- file type: DAT ASCII ---` or `--- file type: DAT BINARY: <bytes> ---` section',
		);

	const cfgText = decodeText(head.subarray(cfgSection.start, cfgSection.end)).text;
	const cfg = parseComtradeCfg(cfgText, source, cfgSection.headerLine);
	const datKind = datSection.type.replace(/^DAT\s*/, '');
	const binary = cfg.fileType !== 'ASCII';
	if ((datKind === 'ASCII') === binary && datKind !== '') {
		throw new ImportError(
			source,
			datSection.headerLine,
			1,
			'cfg-syntax',
			`--- file type: DAT ${datKind} ---`,
			`a DAT section of the type the CFG section gives on line ${cfg.fileTypeLine} (${cfg.fileType})`,
		);
	}
	let end = totalBytes;
	if (datSection.declaredBytes !== undefined) {
		if (datSection.start + datSection.declaredBytes > totalBytes) {
			throw new ImportError(
				source,
				0,
				totalBytes + 1,
				'dat-too-short',
				'',
				`${datSection.declaredBytes} data bytes as the DAT section line ${datSection.headerLine} says; the file has ${totalBytes - datSection.start}`,
			);
		}
		end = datSection.start + datSection.declaredBytes;
	}
	return { sections, cfg, dat: { start: datSection.start, end, headerLine: datSection.headerLine } };
}

/**
 * Read a .cff file.
 * @throws ImportError 'cfg-syntax' when the CFG or DAT section is missing, and every error of parseComtrade,
 *   with lines counted in the .cff
 * @example parseComtradeCff(bytes, 'relay.cff').channels.length // 4
 */
export function parseComtradeCff(bytes: Uint8Array, source: string, options: ComtradeOptions = {}): Capture {
	const { sections, cfg, dat } = cffLayout(bytes, source, bytes.length);
	const capture = buildCapture(cfg, bytes.subarray(dat.start, dat.end), source, source, options, {
		line: dat.headerLine,
		byte: dat.start,
	});
	for (const s of sections) {
		if (s.type === 'INF' || s.type === 'HDR') {
			const t = decodeText(bytes.subarray(s.start, s.end)).text.trim();
			if (t) capture.metadata[`comtrade.${s.type.toLowerCase()}`] = t;
		}
	}
	capture.diagnostics.unshift({
		code: 'comtrade-cff',
		severity: 'info',
		message: `Single-file COMTRADE (.cff) with sections ${sections.map((s) => s.type).join(', ')}.`,
	});
	return capture;
}
