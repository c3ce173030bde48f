// Public API of lib/io: text or bytes -> Capture. Re-exports only.
export * from './import-error.js';
export * from './csv/index.js';
export { parseWav, type WavOptions, type WavChannelCalibration } from './wav.js';
export * from './comtrade/index.js';
export {
	openCaptures,
	openCapture,
	openCsvChunks,
	detectFileKind,
	csvOptionsWithSettings,
	DETECT_HEAD_BYTES,
	type FileKind,
	type InputFile,
	type OpenOptions,
} from './open.js';
export { gapFreeSpan, longestGapFreeRun, type GapFreeSpan } from './gaps.js';
export * from './import-settings.js';
