/** The ImportError a call throws; fails the test when it throws something else or nothing. */
import { expect } from 'vitest';
import { ImportError } from '../../lib/io/import-error.js';

export function importErrorOf(run: () => unknown): ImportError {
	try {
		run();
	} catch (e) {
		expect(e).toBeInstanceOf(ImportError);
		return e as ImportError;
	}
	throw new Error('expected an ImportError');
}
