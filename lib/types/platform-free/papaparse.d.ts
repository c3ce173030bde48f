// The part of papaparse lib/io/csv/cells.ts uses, for tsconfig.lib.json only: @types/papaparse pulls in
// the Node types, which the platform-free lib check must not see. Signature as in @types/papaparse 5.5.
declare const Papa: {
	parse<T>(
		input: string,
		config: { delimiter?: string; quoteChar?: string; header?: false; skipEmptyLines?: boolean },
	): { data: T[]; errors: { message: string; row?: number }[] };
};
export default Papa;
