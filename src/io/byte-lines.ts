/**
 * Stream a text file as lines of bytes, never holding the whole file: plain or gzip
 * (recognised by its magic bytes 1f 8b, whatever the file name says).
 *
 * One working buffer (default 1 MiB) is filled from the file; complete lines are handed to
 * the callback as (buffer, start, end, lineNumber) with `end` excluding "\n" and a trailing
 * "\r"; the incomplete tail is moved to the front before the next fill. A line longer than
 * the buffer is reported as an input error (no real Matrix Market or CSV line is that long).
 */
import { open, stat } from 'node:fs/promises';
import { createReadStream } from 'node:fs';
import { createGunzip } from 'node:zlib';
import { InputError } from './errors.js';

/** Return false to stop reading early. */
export type LineCallback = (buf: Buffer, start: number, end: number, line: number) => boolean | void;

/**
 * Optional fast path: handle all the complete lines in buf[start, end) (end is just after a
 * "\n"; `line` is the number of the first) and return how many lines that was.
 */
export type BlockCallback = (buf: Buffer, start: number, end: number, line: number) => number;

export interface ByteSourceInfo {
  /** Size of the file on disk (compressed size for gzip). */
  fileBytes: number;
  gzip: boolean;
}

export interface LineScanResult extends ByteSourceInfo {
  /** Number of lines seen (a final line without "\n" counts). */
  lines: number;
  /** Bytes of text scanned (after decompression). */
  textBytes: number;
  /** True when the callback stopped the scan. */
  stopped: boolean;
}

const GZIP_MAGIC_0 = 0x1f;
const GZIP_MAGIC_1 = 0x8b;
const NEWLINE = 10;

/** Size on disk and whether the content is gzip (by magic bytes). Missing file → InputError. */
export async function probeFile(path: string): Promise<ByteSourceInfo> {
  let fh;
  try {
    const st = await stat(path);
    if (!st.isFile()) throw new InputError(path, 'is not a regular file');
    fh = await open(path, 'r');
    const head = Buffer.alloc(2);
    const { bytesRead } = await fh.read(head, 0, 2, 0);
    return { fileBytes: st.size, gzip: bytesRead === 2 && head[0] === GZIP_MAGIC_0 && head[1] === GZIP_MAGIC_1 };
  } catch (e) {
    if (e instanceof InputError) throw e;
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EACCES' ? 'permission denied' : (code ?? (e as Error).message);
    throw new InputError(path, `cannot be read (${why})`);
  } finally {
    await fh?.close();
  }
}

/** Call `onLine` for every line of the file, in order. */
export async function forEachLine(
  path: string,
  onLine: LineCallback,
  options: { bufferBytes?: number; info?: ByteSourceInfo; onBlock?: BlockCallback } = {},
): Promise<LineScanResult> {
  const info = options.info ?? (await probeFile(path));
  const scanner = new LineSplitter(path, onLine, options.bufferBytes ?? 1 << 20, options.onBlock);
  if (info.gzip) await scanGzip(path, scanner);
  else await scanPlain(path, scanner);
  scanner.finish();
  return { ...info, lines: scanner.line - 1, textBytes: scanner.textBytes, stopped: scanner.stopped };
}

/** Holds the working buffer and the incomplete tail between fills. */
class LineSplitter {
  readonly buf: Buffer;
  /** Bytes [0, filled) of buf hold text not yet handed out. */
  filled = 0;
  /** Number of the next line to hand out (1-based). */
  line = 1;
  textBytes = 0;
  stopped = false;

  constructor(
    readonly path: string,
    readonly onLine: LineCallback,
    bufferBytes: number,
    readonly onBlock?: BlockCallback,
  ) {
    this.buf = Buffer.allocUnsafe(bufferBytes);
  }

  /** Hand out every complete line in buf[0, filled); keep the tail. */
  drain(): void {
    const buf = this.buf;
    let start = 0;
    if (this.onBlock) {
      // all complete lines at once
      const last = this.filled > 0 ? buf.lastIndexOf(NEWLINE, this.filled - 1) : -1;
      if (last >= 0) {
        this.line += this.onBlock(buf, 0, last + 1, this.line);
        start = last + 1;
      }
    }
    // each "\n" ends one line
    while (!this.stopped && !this.onBlock) {
      const nl = buf.indexOf(NEWLINE, start);
      if (nl < 0 || nl >= this.filled) break;
      const end = nl > start && buf[nl - 1] === 13 ? nl - 1 : nl;
      if (this.onLine(buf, start, end, this.line) === false) this.stopped = true;
      this.line++;
      start = nl + 1;
    }
    if (this.stopped) return;
    const tail = this.filled - start;
    if (tail === buf.length) {
      throw new InputError(this.path, `line is longer than ${buf.length} bytes (not a text matrix file?)`, { line: this.line });
    }
    if (start > 0) buf.copyWithin(0, start, this.filled);
    this.filled = tail;
  }

  /** Append bytes from a decompressed chunk, draining whenever the buffer is full. */
  push(chunk: Uint8Array): void {
    let off = 0;
    this.textBytes += chunk.length;
    // copy as much as fits, then hand out the complete lines
    while (off < chunk.length && !this.stopped) {
      const n = Math.min(chunk.length - off, this.buf.length - this.filled);
      this.buf.set(chunk.subarray(off, off + n), this.filled);
      this.filled += n;
      off += n;
      this.drain();
    }
  }

  /** The last line may lack its "\n". */
  finish(): void {
    if (this.stopped || this.filled === 0) return;
    const end = this.buf[this.filled - 1] === 13 ? this.filled - 1 : this.filled;
    if (this.onLine(this.buf, 0, end, this.line) === false) this.stopped = true;
    this.line++;
    this.filled = 0;
  }
}

async function scanPlain(path: string, s: LineSplitter): Promise<void> {
  const fh = await open(path, 'r');
  try {
    // fill the free part of the buffer straight from the file
    while (!s.stopped) {
      const { bytesRead } = await fh.read(s.buf, s.filled, s.buf.length - s.filled, null);
      if (bytesRead === 0) break;
      s.filled += bytesRead;
      s.textBytes += bytesRead;
      s.drain();
    }
  } finally {
    await fh.close();
  }
}

async function scanGzip(path: string, s: LineSplitter): Promise<void> {
  const source = createReadStream(path, { highWaterMark: 1 << 20 });
  const gunzip = createGunzip({ chunkSize: 1 << 20 });
  source.pipe(gunzip);
  source.on('error', (e) => gunzip.destroy(e));
  try {
    // decompressed chunks in order
    for await (const chunk of gunzip) {
      s.push(chunk as Buffer);
      if (s.stopped) break;
    }
  } catch (e) {
    if (e instanceof InputError) throw e;
    const err = e as NodeJS.ErrnoException;
    const reason =
      err.code === 'Z_BUF_ERROR' || /unexpected end/i.test(err.message)
        ? 'the gzip data ends early (the file is truncated)'
        : `is not valid gzip data (${err.message})`;
    throw new InputError(path, reason, { line: s.line });
  } finally {
    source.destroy();
    gunzip.destroy();
  }
}

