// Public API of lib/io/csv: CSV text or bytes -> Capture. Re-exports only.
export { parseCsv } from './parse-csv.js';
export { CsvStreamReader } from './stream-reader.js';
export { detectCsvLayout } from './detect.js';
export type { CsvOptions, CsvChannelOptions, CsvStreamOptions, CsvLayout, CsvColumnLayout } from './types.js';
export { CsvSampleStream, type SampleSink, type SampleStreamHeader } from './sample-stream.js';
