/**
 * Write a large text file in chunks, atomically: the chunks stream (through gzip when asked)
 * into a temporary sibling which is renamed over the target only when complete, so readers
 * see either the old file or the whole new one (rename is atomic on one filesystem).
 */
import { createWriteStream, mkdirSync, renameSync, rmSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { createGzip } from 'node:zlib';

export interface StreamWriteOptions {
  /** Compress with gzip (default: when the path ends in `.gz`). */
  gzip?: boolean;
}

export async function writeChunksAtomic(
  path: string,
  chunks: Iterable<string> | AsyncIterable<string>,
  options: StreamWriteOptions = {},
): Promise<void> {
  const dir = dirname(path);
  mkdirSync(dir, { recursive: true });
  const tmp = join(dir, `.${basename(path)}.${process.pid}.${Date.now()}.tmp`);
  const gzip = options.gzip ?? path.endsWith('.gz');
  try {
    const source = Readable.from(chunks, { objectMode: false });
    const sink = createWriteStream(tmp);
    if (gzip) await pipeline(source, createGzip({ level: 6 }), sink);
    else await pipeline(source, sink);
    renameSync(tmp, path);
  } catch (e) {
    rmSync(tmp, { force: true });
    throw e;
  }
}

/** Batch many small strings into chunks of about `chunkChars` characters. */
export function* batchLines(lines: Iterable<string>, chunkChars = 1 << 20): Generator<string> {
  let buf = '';
  // accumulate lines until the chunk is full
  for (const line of lines) {
    buf += line;
    if (buf.length >= chunkChars) {
      yield buf;
      buf = '';
    }
  }
  if (buf.length > 0) yield buf;
}
