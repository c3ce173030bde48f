// @vitest-environment jsdom
/**
 * Remembered settings: the FNV-1a 32-bit hash against the reference test vectors of its authors
 * ("" → 0x811c9dc5, "a" → 0xe40c292c, "foobar" → 0xbf9cf968; from memory), file identities, and the store.
 */
import { beforeEach, describe, expect, it } from 'vitest';
import { fileIdentity, fnv1a32, SettingsMemory, SETTINGS_MAX } from '../../src/ui/state/remembered.js';

const enc = (s: string) => new TextEncoder().encode(s);
const source = (name: string, bytes: Uint8Array) => ({
	name,
	size: bytes.length,
	slice: async (a: number, b: number) => bytes.subarray(a, b),
});

describe('fnv1a32', () => {
	it('matches the FNV-1a 32-bit test vectors', () => {
		expect(fnv1a32(enc(''))).toBe(0x811c9dc5);
		expect(fnv1a32(enc('a'))).toBe(0xe40c292c);
		expect(fnv1a32(enc('foobar'))).toBe(0xbf9cf968);
	});
});

describe('fileIdentity', () => {
	it('same name, size and content: same identity; one changed byte at either end, or another name: a different one', async () => {
		const a = new Uint8Array(300_000).map((_, i) => (i * 7) & 255);
		const id = await fileIdentity(source('log.csv', a));
		expect(await fileIdentity(source('log.csv', a.slice()))).toBe(id);
		const head = a.slice();
		head[10] ^= 1;
		const tail = a.slice();
		tail[a.length - 3] ^= 1;
		expect(await fileIdentity(source('log.csv', head))).not.toBe(id);
		expect(await fileIdentity(source('log.csv', tail))).not.toBe(id);
		expect(await fileIdentity(source('other.csv', a))).not.toBe(id);
	});
});

describe('SettingsMemory', () => {
	beforeEach(() => localStorage.clear());
	it('gives back the settings kept for an identity, and keeps at most SETTINGS_MAX files (newest)', () => {
		const m = new SettingsMemory();
		m.set(
			'a|1|0',
			{ csv: { unreadableCells: 'gap' } },
			{ refChannel: 'I1', limits: 'en50160' },
			new Date(Date.UTC(2025, 0, 1)),
		);
		expect(m.get('a|1|0')?.overrides.csv?.unreadableCells).toBe('gap');
		expect(m.get('a|1|0')?.analysis.refChannel).toBe('I1');
		for (let i = 0; i < SETTINGS_MAX + 5; i++) m.set(`f${i}`, {}, {}, new Date(Date.UTC(2026, 0, 1, 0, 0, i + 10)));
		expect(m.get('a|1|0')).toBeUndefined();
		expect(m.get(`f${SETTINGS_MAX + 4}`)).toBeDefined();
	});
});
