// Type declarations for fft.js 4.x (the package ships none). API read from its README and source.
declare module 'fft.js' {
	export default class FFT {
		constructor(size: number);
		readonly size: number;
		createComplexArray(): number[];
		toComplexArray(input: ArrayLike<number>, storage?: number[]): number[];
		fromComplexArray(complex: ArrayLike<number>, storage?: number[]): number[];
		completeSpectrum(spectrum: number[] | Float64Array): void;
		transform(out: number[] | Float64Array, data: ArrayLike<number>): void;
		realTransform(out: number[] | Float64Array, data: ArrayLike<number>): void;
		inverseTransform(out: number[] | Float64Array, data: ArrayLike<number>): void;
	}
}
