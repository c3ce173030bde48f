// COMTRADE (IEEE C37.111 / IEC 60255-24) readers. Re-exports only.
export { parseComtrade, type ComtradeOptions } from './parse.js';
export { parseComtradeCff } from './cff.js';
export { parseComtradeCfg, type ComtradeConfig, type ComtradeFileType } from './cfg.js';
export { cffLayout } from './cff.js';
export { ComtradeSampleStream, streamableRate } from './sample-stream.js';
export { decodeText } from './text.js';
