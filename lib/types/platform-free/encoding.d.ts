// TextEncoder and TextDecoder (WHATWG Encoding Standard) exist in browsers and in Node alike, so lib/
// may use them; tsconfig.lib.json declares just them instead of the DOM or Node type libraries.
/** Base64 to a binary string (HTML Standard, also a Node global); lib/trend/resample-simd.ts decodes its module with it. */
declare function atob(data: string): string;
declare class TextDecoder {
	constructor(label?: string, options?: { fatal?: boolean; ignoreBOM?: boolean });
	readonly encoding: string;
	decode(input?: ArrayBufferView | ArrayBuffer, options?: { stream?: boolean }): string;
}
declare class TextEncoder {
	readonly encoding: string;
	encode(input?: string): Uint8Array<ArrayBuffer>;
	encodeInto(source: string, destination: Uint8Array): { read: number; written: number };
}
