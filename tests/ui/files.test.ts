import { describe, expect, it } from 'vitest';
import { groupFiles, groupLabel } from '../../src/ui/files.js';

const named = (...names: string[]) => names.map((name) => ({ name }));

describe('groupFiles', () => {
	it('groupFiles puts a COMTRADE .cfg with its .dat (any case) and keeps other files alone (IEEE C37.111: same base name)', () => {
		const g = groupFiles(named('a.csv', 'F1.DAT', 'b.wav', 'f1.cfg', 'f1.hdr'));
		// groups in order of first appearance; inside a COMTRADE group the .cfg comes first
		expect(g.map((x) => x.map((f) => f.name))).toEqual([['a.csv'], ['f1.cfg', 'F1.DAT', 'f1.hdr'], ['b.wav']]);
	});

	it('groupFiles keeps a lone .dat as its own group (the importer then names the missing .cfg)', () => {
		expect(groupFiles(named('x.dat')).map((g) => g.length)).toEqual([1]);
	});

	it('groupLabel names a group after its first file, without folders', () => {
		expect(groupLabel(named('dir/sub/f1.cfg', 'dir/sub/f1.dat'))).toBe('f1.cfg');
		expect(groupFiles([])).toEqual([]);
	});
});
