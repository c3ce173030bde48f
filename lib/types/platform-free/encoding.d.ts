// TextEncoder and TextDecoder (WHATWG Encoding Standard) exist in browsers and in Node alike, so lib/
// may use them; tsconfig.lib.json declares just them instead of the DOM or Node type libraries.
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
