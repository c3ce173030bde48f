/**
 * File-system facts in plain words: what an error code means to a user, what kind of thing a path is,
 * and the checks made before any file is read (only regular files; the size known before reading).
 */
import { closeSync, constants, fstatSync, openSync, readSync, statSync, type Stats } from 'node:fs';
import { UsageError } from './usage-error.js';

/** A file-system error code (ENOENT, EACCES, ...) in plain words. */
export function fsErrorWords(code: string | undefined): string {
	switch (code) {
		case 'ENOENT':
			return 'no such file or folder';
		case 'EACCES':
		case 'EPERM':
			return 'permission denied';
		case 'ELOOP':
			return 'a symbolic link that loops back on itself';
		case 'EISDIR':
			return 'this is a folder, not a file';
		case 'ENOTDIR':
			return 'a part of this path is a file, not a folder';
		case 'ENAMETOOLONG':
			return 'the path is too long';
		case 'EIO':
			return 'the device reported a read error';
		case 'EMFILE':
		case 'ENFILE':
			return 'too many files open at once';
		case 'ENOMEM':
			return 'out of memory';
		default:
			return code ? `the system refused (${code})` : 'the system refused';
	}
}

/** What a non-regular, non-folder entry is, in words ("a named pipe (FIFO)", ...). */
export function kindWords(st: Stats): string {
	if (st.isFIFO()) return 'a named pipe (FIFO)';
	if (st.isCharacterDevice()) return 'a character device';
	if (st.isBlockDevice()) return 'a block device';
	if (st.isSocket()) return 'a socket';
	if (st.isDirectory()) return 'a folder';
	if (st.isSymbolicLink()) return 'a symbolic link';
	return 'not a regular file';
}

/** Why `path` cannot be read as a capture, or undefined when it is a regular file (`size` is then set). */
export function regularFileProblem(
	path: string,
): { message: string; size?: undefined } | { message?: undefined; size: number } {
	let st: Stats;
	try {
		st = statSync(path);
	} catch (e) {
		return { message: `cannot read the file: ${fsErrorWords((e as NodeJS.ErrnoException).code)}` };
	}
	if (st.isFile()) return { size: st.size };
	return { message: `${kindWords(st)}, not a regular file: only regular files are read` };
}

/** A byte count in words: '2 GiB', '512 MiB', '1.3 GB (1300000000 bytes)'. */
export function bytesWords(bytes: number): string {
	const units = ['bytes', 'KiB', 'MiB', 'GiB', 'TiB'];
	let x = bytes;
	let u = 0;
	for (; x >= 1024 && u < units.length - 1; u++) x /= 1024;
	return u === 0 ? `${bytes} bytes` : `${x >= 10 || Number.isInteger(x) ? x.toFixed(0) : x.toFixed(1)} ${units[u]}`;
}

/**
 * The largest file `analyse` reads whole: 2 GiB - 1 byte, Node's limit for one read into memory
 * (kIoMaxLength, 2^31 - 1 bytes; larger reads fail with ERR_FS_FILE_TOO_LARGE).
 */
export const ANALYSE_MAX_FILE_BYTES = 2 ** 31 - 1;

/** The refusal of a file too large for `analyse`, naming the limit and the command that handles it. */
export function tooLargeWords(sizeBytes: number, limitBytes: number, file: string): string {
	return `the file is ${bytesWords(sizeBytes)}, more than the ${bytesWords(limitBytes + 1)} analyse reads into memory at once; for long recordings use \`sinecheck trend ${file}\`, which reads it in pieces`;
}

/**
 * Reads a whole regular file, refusing anything else before a byte is read: the file is opened without
 * blocking (a FIFO with no writer would otherwise wait forever), checked to be a regular file on the
 * open descriptor, and its size checked against `maxBytes`.
 * @throws UsageError with a message in user words (no such file, permission denied, a named pipe, too large)
 */
export function readRegularFile(path: string, maxBytes = ANALYSE_MAX_FILE_BYTES, shownAs = path): Uint8Array {
	let fd: number;
	try {
		fd = openSync(path, constants.O_RDONLY | constants.O_NONBLOCK);
	} catch (e) {
		throw new UsageError(`cannot read the file: ${fsErrorWords((e as NodeJS.ErrnoException).code)}`);
	}
	try {
		const st = fstatSync(fd);
		if (!st.isFile()) throw new UsageError(`${kindWords(st)}, not a regular file: only regular files are read`);
		if (st.size > maxBytes) throw new UsageError(tooLargeWords(st.size, maxBytes, shownAs));
		const bytes = Buffer.allocUnsafe(st.size);
		let got = 0;
		while (got < st.size) {
			const n = readSync(fd, bytes, got, st.size - got, got);
			if (n === 0) break;
			got += n;
		}
		return new Uint8Array(bytes.buffer, bytes.byteOffset, got);
	} catch (e) {
		if (e instanceof UsageError) throw e;
		throw new UsageError(`cannot read the file: ${fsErrorWords((e as NodeJS.ErrnoException).code)}`);
	} finally {
		closeSync(fd);
	}
}
