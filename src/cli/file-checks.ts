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
	const { fd, size } = openRegularFile(path, maxBytes, shownAs);
	try {
		const bytes = Buffer.allocUnsafe(size);
		const got = readFully(fd, bytes, 0, size, 0);
		return new Uint8Array(bytes.buffer, bytes.byteOffset, got);
	} finally {
		closeSync(fd);
	}
}

/** Bytes read per piece by RegularFileChunks: one reused buffer, so the file's size in fresh memory is never paid. */
export const READ_CHUNK_BYTES = 1 << 20;

/** A regular file opened for reading in pieces (after readRegularFile's checks); close() when done. */
export interface RegularFileChunks {
	size: number;
	/** The first bytes of the file (up to `headBytes`). */
	head: Uint8Array;
	/** Reads the whole file in order, handing each piece to `push` (valid until push returns). */
	eachChunk(push: (chunk: Uint8Array) => void): void;
	close(): void;
}

/**
 * Opens a regular file to be read in pieces, with readRegularFile's checks (regular file, size at most
 * `maxBytes`) made before a byte is read.
 * @throws UsageError with a message in user words
 */
export function openRegularFileChunks(
	path: string,
	headBytes: number,
	maxBytes = ANALYSE_MAX_FILE_BYTES,
	shownAs = path,
): RegularFileChunks {
	const { fd, size } = openRegularFile(path, maxBytes, shownAs);
	try {
		const head = new Uint8Array(Math.min(headBytes, size));
		const got = readFully(fd, head, 0, head.length, 0);
		return {
			size,
			head: head.subarray(0, got),
			eachChunk(push) {
				const buf = new Uint8Array(Math.min(READ_CHUNK_BYTES, Math.max(1, size)));
				for (let at = 0; at < size;) {
					const n = readFully(fd, buf, 0, Math.min(buf.length, size - at), at);
					if (n === 0) break;
					push(buf.subarray(0, n));
					at += n;
				}
			},
			close: () => closeSync(fd),
		};
	} catch (e) {
		closeSync(fd);
		throw e;
	}
}

/** Opens without blocking and checks on the descriptor: a regular file of at most `maxBytes`. */
function openRegularFile(path: string, maxBytes: number, shownAs: string): { fd: number; size: number } {
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
		return { fd, size: st.size };
	} catch (e) {
		closeSync(fd);
		throw asUsageError(e);
	}
}

/** Reads `length` bytes at file offset `position` into buf[offset..] (fewer at the end of the file). */
function readFully(fd: number, buf: Uint8Array, offset: number, length: number, position: number): number {
	let got = 0;
	try {
		while (got < length) {
			const n = readSync(fd, buf, offset + got, length - got, position + got);
			if (n === 0) break;
			got += n;
		}
	} catch (e) {
		throw asUsageError(e);
	}
	return got;
}

function asUsageError(e: unknown): UsageError {
	if (e instanceof UsageError) return e;
	return new UsageError(`cannot read the file: ${fsErrorWords((e as NodeJS.ErrnoException).code)}`);
}
