// The part of the WebAssembly JS API (a standard global in browsers and in Node alike) that
// lib/trend/resample-simd.ts uses, for tsconfig.lib.json only (the DOM and Node type libraries declare it
// for the other configs).
declare namespace WebAssembly {
	class Module {
		constructor(bytes: ArrayBufferView | ArrayBuffer);
	}
	class Instance {
		constructor(module: Module, imports?: object);
		readonly exports: Record<string, unknown>;
	}
	class Memory {
		constructor(descriptor: { initial: number; maximum?: number });
		readonly buffer: ArrayBuffer;
	}
	function validate(bytes: ArrayBufferView | ArrayBuffer): boolean;
}
