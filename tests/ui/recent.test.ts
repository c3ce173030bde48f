// @vitest-environment jsdom
import { beforeEach, describe, expect, it } from 'vitest';
import { RECENT_MAX, RECENT_STORAGE_KEY, RecentFiles } from '../../src/ui/state/recent.svelte.js';

describe('RecentFiles', () => {
	beforeEach(() => localStorage.clear());

	it('add(name) puts the newest first, keeps names and times only, and survives a reload (localStorage)', () => {
		const r = new RecentFiles();
		r.add('a.csv', new Date('2026-01-02T03:04:05Z'));
		r.add('b.wav', new Date('2026-01-02T04:00:00Z'));
		const again = new RecentFiles();
		expect(again.entries).toEqual([
			{ name: 'b.wav', openedAt: '2026-01-02T04:00:00.000Z' },
			{ name: 'a.csv', openedAt: '2026-01-02T03:04:05.000Z' },
		]);
		expect(Object.keys(JSON.parse(localStorage.getItem(RECENT_STORAGE_KEY)!)[0]).sort()).toEqual(['name', 'openedAt']);
	});

	it('add(name) of a name already listed moves it to the top instead of listing it twice', () => {
		const r = new RecentFiles();
		r.add('a.csv');
		r.add('b.csv');
		r.add('a.csv');
		expect(r.entries.map((e) => e.name)).toEqual(['a.csv', 'b.csv']);
	});

	it(`add() keeps at most ${RECENT_MAX} entries`, () => {
		const r = new RecentFiles();
		for (let i = 0; i < RECENT_MAX + 5; i++) r.add(`f${i}.csv`);
		expect(r.entries).toHaveLength(RECENT_MAX);
		expect(r.entries[0].name).toBe(`f${RECENT_MAX + 4}.csv`);
	});

	it('a corrupt stored list reads as empty instead of breaking the app', () => {
		localStorage.setItem(RECENT_STORAGE_KEY, '{not json');
		expect(new RecentFiles().entries).toEqual([]);
		localStorage.setItem(RECENT_STORAGE_KEY, '[{"name":1}]');
		expect(new RecentFiles().entries).toEqual([]);
	});

	it('clear() empties the list and the storage', () => {
		const r = new RecentFiles();
		r.add('a.csv');
		r.clear();
		expect(r.entries).toEqual([]);
		expect(localStorage.getItem(RECENT_STORAGE_KEY)).toBeNull();
	});
});
