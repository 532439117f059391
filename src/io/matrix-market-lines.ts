/**
 * Line-by-line parser of a Matrix Market file (see ./matrix-market-header.ts for the header
 * rules). It takes lines from ./byte-lines.ts and keeps only typed arrays:
 *
 * - `triplets` mode (stiffness/mass): coordinate entries `i j a`, or the values of an array
 *   file, go to preallocated (row, col, value) arrays, 0-based; zeros of array files are skipped.
 * - `dense` mode (mode shapes): the values of an `array` file in column-major order.
 *
 * Every defect throws InputError(file, reason, { line }). Blank lines are allowed anywhere;
 * `%` comments only before the size line.
 *
 * Bounds (so a small file cannot make the reader run for minutes or fill the memory):
 * - the size line is refused before anything is allocated when the file cannot hold the
 *   declared entries, or when the order implies more memory than the machine has
 *   (./matrix-market-memory.ts); a stiffness file (`role: 'stiffness'`) declaring fewer
 *   coordinate entries than rows is refused too: some row would have no entry, not even its
 *   diagonal, and no stiffness of a solvable model has an empty row (a mass file may: a
 *   lumped mass often has no rotational terms);
 * - repeated entries are summed while the triplet arrays grow (`sumDuplicateTriplets` once
 *   they hold ≥ COMPACT_FROM triplets and are full), so memory follows the distinct entries;
 * - text that is not data (blank lines, comments, padding) is limited: at most
 *   FILLER_BYTES + BYTES_PER_ENTRY × (entries read so far) bytes of text in all. A real
 *   entry line is well under 100 bytes; a file of gigabytes of blank lines stops after
 *   about 16 MiB.
 *
 * With `screening: 'record'` values that are not finite (nan, inf, 1e400) are kept and their
 * first lines listed (`nonFinite`) instead of refused, so the matrix-finite rule can report them.
 */
import { InputError } from './errors.js';
import {
  checkForStructuralMatrix, parseBanner, parseSizeLine, quoteText,
  type MatrixMarketBanner, type MatrixMarketSize,
} from './matrix-market-header.js';
import {
  realOut, scan, scanReal, scanRealInto, scanUnsigned, skipBlanks, tokenText,
  SCAN_NOT_INTEGER, SCAN_OK, SCAN_TOO_LARGE,
} from './number-scan.js';
import type { ByteSourceInfo } from './byte-lines.js';
import { distinctEntryBound, formatBytes, memoryBudgetBytes, readingBytes, solvingBytes } from './matrix-market-memory.js';
import { sumDuplicateTriplets } from '../sparse/assemble.js';

/** Deflate cannot expand data by more than about 1032:1 (RFC 1951 stored/length limits). */
const GZIP_MAX_RATIO = 1032;
/** Fewest bytes a coordinate entry line can take: "1 1 1\n". */
const MIN_ENTRY_BYTES = 6;
/** Fewest bytes of an array value line: "1\n". */
const MIN_VALUE_BYTES = 2;
/** Keys 2·row + flag must fit in an Int32. */
const MAX_ORDER = 2 ** 30 - 1;
/** Rows a coordinate file may leave empty beyond the 2 per entry its entries can reach (our choice: about 20 MB of per-row arrays). */
const EMPTY_ROW_SLACK = 1_000_000;
const MAX_ENTRIES = 2 ** 31 - 1;
/** Text allowed beyond the data: 16 MiB, plus BYTES_PER_ENTRY per entry read. */
export const FILLER_BYTES = 16 * 2 ** 20;
export const BYTES_PER_ENTRY = 256;
/** Duplicates are summed in place once the full triplet arrays hold this many. */
const COMPACT_FROM = 2 ** 20;
/** Smallest triplet capacity (64 kB of triplets). */
const MIN_TRIPLETS = 4096;
/** How many non-finite entries are listed with their lines. */
const NON_FINITE_LISTED = 5;

export interface MatrixLinesOptions {
  /** Refuse non-finite values (default) or record them. */
  screening?: 'refuse' | 'record';
  /** A stiffness file must declare at least one entry per row. */
  role?: 'stiffness' | 'mass';
  /** Refuse the size line when the order implies more than this many bytes (default: the machine's memory). */
  memoryBudgetBytes?: number;
  /** Text allowed beyond the data (default FILLER_BYTES; tests use less). */
  fillerBytes?: number;
  /** Sum duplicates once the full triplet arrays hold this many (default COMPACT_FROM; tests use less). */
  compactFrom?: number;
  /** Check the banner and the size line, allocate nothing (see readMatrixHeader). */
  headerOnly?: boolean;
}

/** A non-finite entry: 1-based row, column and line. */
export interface NonFiniteEntry {
  row: number;
  col: number;
  line: number;
}

export type ParseMode = 'triplets' | 'dense';

/** Where in the file the parser is. */
const State = { Banner: 0, Header: 1, Entries: 2 } as const;

export class MatrixMarketLines {
  banner: MatrixMarketBanner | undefined;
  size: MatrixMarketSize | undefined;
  /** Data lines read (coordinate entries or array values). */
  count = 0;
  /** Triplets (mode `triplets`), 0-based. */
  rows = new Int32Array(0);
  cols = new Int32Array(0);
  vals = new Float64Array(0);
  /** Triplets stored (array zeros are not stored). */
  stored = 0;
  /** Dense values, column-major (mode `dense`). */
  dense = new Float64Array(0);
  /** Triplets summed into an earlier one while reading (see sumDuplicateTriplets). */
  mergedWhileReading = 0;
  /** First non-finite entries (screening 'record'); nonFiniteLines counts them all. */
  nonFinite: NonFiniteEntry[] = [];
  nonFiniteLines = 0;
  /** Bytes of text handed to onBlock so far. */
  private textBytes = 0;
  private state: number = State.Banner;
  /** Data lines may take the one-pass path (real field; coordinate entries or array values). */
  private fast = false;
  private n = 0;
  private declared = 0;
  private symmetric = false;
  private integer = false;
  /** Array files: position of the next value. */
  private nextRow = 0;
  private nextCol = 0;

  constructor(
    readonly file: string,
    readonly mode: ParseMode,
    readonly source: ByteSourceInfo,
    readonly options: MatrixLinesOptions = {},
  ) {}

  /** The size line has been read (header-only readers stop here). */
  get headerDone(): boolean {
    return this.state === State.Entries;
  }

  /** The LineCallback. */
  readonly onLine = (buf: Buffer, start: number, end: number, line: number): void => {
    if (this.state === State.Entries) {
      if (this.banner!.format === 'coordinate') this.coordinateLine(buf, start, end, line);
      else this.arrayLine(buf, start, end, line);
    } else if (this.state === State.Banner) {
      this.banner = parseBanner(this.file, buf.toString('latin1', start, end));
      if (this.mode === 'triplets') checkForStructuralMatrix(this.file, this.banner);
      else checkForDenseArray(this.file, this.banner);
      this.symmetric = this.banner.symmetry === 'symmetric';
      this.integer = this.banner.field === 'integer';
      this.state = State.Header;
    } else {
      const p = skipBlanks(buf, start, end);
      if (p === end || buf[p] === 37) return; // blank line or '%' comment
      this.startEntries(buf.toString('latin1', start, end), line);
    }
  };

  /**
   * The BlockCallback: complete lines in buf[start, end). Entry lines of the plain shape
   * `digits blanks digits blanks real\n` of a real coordinate file are parsed in one pass
   * here; any other line (header, blank, CRLF, defect) goes through onLine.
   */
  readonly onBlock = (buf: Buffer, start: number, end: number, line: number): number => {
    let p = start;
    let ln = line;
    // one line per turn: fast entries when possible, else the general line handler
    while (p < end) {
      if (this.fast) {
        const q = this.banner!.format === 'coordinate' ? this.fastEntry(buf, p, end) : this.fastValue(buf, p, end);
        if (q >= 0) {
          p = q;
          ln++;
          continue;
        }
      }
      const nl = buf.indexOf(10, p);
      this.onLine(buf, p, nl > p && buf[nl - 1] === 13 ? nl - 1 : nl, ln++);
      p = nl + 1;
    }
    this.textBytes += end - start;
    if (this.textBytes > (this.options.fillerBytes ?? FILLER_BYTES) + BYTES_PER_ENTRY * this.count) this.refuseFiller(ln - 1);
    return ln - line;
  };

  /**
   * One entry line of the common shape, parsed in place; returns the position after its
   * "\n", or −1 (nothing stored) when the line needs the general handler.
   */
  private fastEntry(buf: Buffer, p: number, end: number): number {
    let i = 0, j = 0;
    const s0 = p;
    // row index
    for (let d = buf[p] - 48; d >= 0 && d <= 9; d = buf[++p] - 48) i = i * 10 + d;
    if (p === s0 || buf[p] !== 32) return -1;
    while (buf[p] === 32) p++;
    const s1 = p;
    // column index
    for (let d = buf[p] - 48; d >= 0 && d <= 9; d = buf[++p] - 48) j = j * 10 + d;
    if (p === s1 || buf[p] !== 32) return -1;
    while (buf[p] === 32) p++;
    scanRealInto(buf, p, end);
    const v = realOut[0];
    const e = scan.end;
    if (scan.status !== SCAN_OK || e >= end || buf[e] !== 10 || v - v !== 0) return -1;
    if (i < 1 || i > this.n || j < 1 || j > this.n || (this.symmetric && j > i) || this.count === this.declared) return -1;
    if (this.stored === this.rows.length) this.grow();
    const k = this.stored++;
    this.rows[k] = i - 1;
    this.cols[k] = j - 1;
    this.vals[k] = v;
    this.count++;
    return e + 1;
  }

  /** One array value line `real\n`, as fastEntry; −1 when the general handler is needed. */
  private fastValue(buf: Buffer, p: number, end: number): number {
    scanRealInto(buf, p, end);
    const v = realOut[0];
    const e = scan.end;
    if (scan.status !== SCAN_OK || e === p || e >= end || buf[e] !== 10 || v - v !== 0 || this.count === this.declared) return -1;
    this.storeArrayValue(v);
    return e + 1;
  }

  /** Too much text for the entries read: blank lines, comments or padding. */
  private refuseFiller(line: number): never {
    const what = this.banner?.format === 'array' ? 'values' : 'entries';
    throw new InputError(
      this.file,
      `${this.textBytes} bytes of text hold only ${this.count} ${what}: the rest is blank lines, comments or padding, ` +
        `beyond the ${(this.options.fillerBytes ?? FILLER_BYTES) / 2 ** 20} MiB + ${BYTES_PER_ENTRY} bytes per entry this reader accepts`,
      { line },
    );
  }

  /** After the last line: the file must have held a header and every declared entry. */
  finish(lastLine: number): void {
    if (this.state === State.Banner) throw new InputError(this.file, 'the file is empty', { line: 1 });
    if (this.state === State.Header) {
      throw new InputError(this.file, 'the file ends before the size line', { line: Math.max(1, lastLine) });
    }
    if (this.count < this.declared) {
      const what = this.banner!.format === 'coordinate' ? 'entries' : 'values';
      throw new InputError(
        this.file,
        `the file ends after ${this.count} of the ${this.declared} ${what} declared on line ${this.size!.line}`,
        { line: Math.max(1, lastLine) },
      );
    }
  }

  private startEntries(text: string, line: number): void {
    const b = this.banner!;
    const size = parseSizeLine(this.file, text, line, b.format);
    if (this.mode === 'triplets' && size.rows !== size.cols) {
      throw new InputError(this.file, `the matrix is ${size.rows} × ${size.cols}; a stiffness or mass matrix must be square`, { line });
    }
    if (size.rows === 0 || size.cols === 0) throw new InputError(this.file, `the matrix has no rows or no columns (${size.rows} × ${size.cols})`, { line });
    if (b.symmetry === 'symmetric' && size.rows !== size.cols) {
      throw new InputError(this.file, `a symmetric matrix must be square, but the size line says ${size.rows} × ${size.cols}`, { line });
    }
    if (size.rows > MAX_ORDER) throw new InputError(this.file, `${size.rows} rows is beyond what this tool handles (${MAX_ORDER})`, { line });
    if (b.format === 'array' && b.symmetry === 'symmetric') size.entries = (size.rows * (size.rows + 1)) / 2;
    this.checkPlausible(size, line);
    this.checkMemory(size, line);
    this.checkEmptyRows(size, line);
    if (this.options.role === 'stiffness' && b.format === 'coordinate' && size.entries < size.rows) {
      throw new InputError(
        this.file,
        `the stiffness matrix has ${size.rows} rows but declares only ${size.entries} entries, so some row has no entry, ` +
          'not even its diagonal; a stiffness matrix of a solvable model has no empty row',
        { line },
      );
    }
    this.size = size;
    this.n = size.rows;
    this.declared = size.entries;
    if (this.options.headerOnly) {
      this.state = State.Entries;
      return;
    }
    this.allocate(size);
    this.state = State.Entries;
    this.fast = b.field === 'real' && (b.format === 'array' || this.mode === 'triplets');
  }

  /** A declared size must fit in the file: reject it before allocating anything. */
  private checkPlausible(size: MatrixMarketSize, line: number): void {
    const perEntry = this.banner!.format === 'coordinate' ? MIN_ENTRY_BYTES : MIN_VALUE_BYTES;
    const maxText = this.source.gzip ? this.source.fileBytes * GZIP_MAX_RATIO : this.source.fileBytes;
    const what = this.banner!.format === 'coordinate' ? 'entries' : 'values';
    if (size.entries > MAX_ENTRIES) {
      throw new InputError(this.file, `declares ${size.entries} ${what}, more than this tool handles (${MAX_ENTRIES})`, { line });
    }
    if (size.entries * perEntry > maxText) {
      const held = this.source.gzip ? `even decompressed (at most ${GZIP_MAX_RATIO}:1) ` : '';
      throw new InputError(
        this.file,
        `declares ${size.entries} ${what}, but a file of ${this.source.fileBytes} bytes ${held}can hold at most ` +
          `${Math.floor(maxText / perEntry)} (each needs at least ${perEntry} bytes); the size line is wrong or the file is cut short`,
        { line },
      );
    }
  }

  /**
   * Each stored entry touches at most two rows (its row and, mirrored, its column), so a coordinate
   * file of L entries leaves at least n − 2L rows and columns entirely empty. A lumped mass matrix
   * legitimately lacks its rotational rows (about half of a 6-DOF-per-node model); beyond that and a
   * fixed slack the order is not a model's but a size line out of step with the data, and reading
   * it would allocate for rows that hold nothing.
   */
  private checkEmptyRows(size: MatrixMarketSize, line: number): void {
    if (this.banner!.format !== 'coordinate') return;
    const emptyAtLeast = size.rows - 2 * size.entries;
    if (emptyAtLeast <= EMPTY_ROW_SLACK) return;
    throw new InputError(
      this.file,
      `the size line declares ${size.rows} rows but only ${size.entries} entries, so at least ${emptyAtLeast} rows would hold nothing at all; the size line is out of step with the data`,
      { line },
    );
  }

  /** Refuse an order whose model cannot fit in memory here, with the figure. */
  private checkMemory(size: MatrixMarketSize, line: number): void {
    const n = size.rows;
    const need =
      this.mode === 'dense'
        ? 8 * size.entries
        : readingBytes(n, size.entries, this.symmetric) + solvingBytes(n);
    const budget = this.options.memoryBudgetBytes ?? memoryBudgetBytes();
    if (need <= budget) return;
    const what = this.mode === 'dense' ? 'holding these values' : 'reading and solving a model of this order';
    throw new InputError(
      this.file,
      `the size line declares ${size.rows} × ${size.cols} with ${size.entries} ${this.banner!.format === 'array' ? 'values' : 'entries'}; ` +
        `${what} needs at least ${formatBytes(need)}, more than the ${formatBytes(budget)} of memory here`,
      { line },
    );
  }

  private allocate(size: MatrixMarketSize): void {
    if (this.mode === 'dense') {
      this.dense = new Float64Array(size.entries);
      return;
    }
    // never more than the distinct entries the order allows (duplicates are summed on the way)
    // (at least MIN_TRIPLETS, so a tiny matrix is not summed every few lines)
    const most = Math.min(size.entries, Math.max(MIN_TRIPLETS, distinctEntryBound(size.rows, this.symmetric)));
    // plain files: exactly that; gzip: a generous guess, grown when needed
    const cap = this.source.gzip ? Math.min(most, Math.max(1 << 16, this.source.fileBytes)) : most;
    this.rows = new Int32Array(cap);
    this.cols = new Int32Array(cap);
    this.vals = new Float64Array(cap);
  }

  /**
   * Room for one more triplet: sum duplicates first when the arrays are large, and double
   * them only when that freed less than a quarter.
   */
  private grow(): void {
    const had = this.rows.length;
    if (had >= (this.options.compactFrom ?? COMPACT_FROM) || had >= Math.max(MIN_TRIPLETS, distinctEntryBound(this.n, this.symmetric))) {
      const kept = sumDuplicateTriplets(this.n, this.rows, this.cols, this.vals, this.stored);
      this.mergedWhileReading += this.stored - kept;
      this.stored = kept;
      if (kept <= had - (had >> 2)) return;
    }
    const cap = Math.min(this.declared, Math.max(16, had * 2));
    const r = new Int32Array(cap);
    r.set(this.rows);
    this.rows = r;
    const c = new Int32Array(cap);
    c.set(this.cols);
    this.cols = c;
    const v = new Float64Array(cap);
    v.set(this.vals);
    this.vals = v;
  }

  /** `i j a`: 1-based row and column, then the value. */
  private coordinateLine(buf: Buffer, start: number, end: number, line: number): void {
    let p = skipBlanks(buf, start, end);
    if (p === end) return; // blank line
    if (buf[p] === 37) throw new InputError(this.file, "a '%' comment line after the size line; comments must come before it", { line });
    if (this.count === this.declared) {
      throw new InputError(this.file, `more entries than the ${this.declared} declared on line ${this.size!.line}`, { line });
    }
    const i = this.index(buf, p, end, line, 'row');
    p = skipBlanks(buf, scan.end, end);
    if (p === end) throw new InputError(this.file, `the entry has only a row index; expected 'row column value'`, { line });
    const j = this.index(buf, p, end, line, 'column');
    p = skipBlanks(buf, scan.end, end);
    if (p === end) throw new InputError(this.file, `the entry (${i}, ${j}) has no value; expected 'row column value'`, { line });
    const v = this.value(buf, p, end, line);
    if (v - v !== 0) this.noteNonFinite(i, j, line);
    if (this.symmetric && j > i) {
      throw new InputError(
        this.file,
        `entry (${i}, ${j}) lies above the diagonal; a symmetric file stores only the lower triangle (row ≥ column)`,
        { line },
      );
    }
    if (this.stored === this.rows.length) this.grow();
    const k = this.stored++;
    this.rows[k] = i - 1;
    this.cols[k] = j - 1;
    this.vals[k] = v;
    this.count++;
  }

  /** One value of an array file; its position follows from the count (column-major). */
  private arrayLine(buf: Buffer, start: number, end: number, line: number): void {
    const p = skipBlanks(buf, start, end);
    if (p === end) return;
    if (this.count === this.declared) {
      throw new InputError(this.file, `more values than the ${this.declared} an array of this size holds`, { line });
    }
    const v = this.value(buf, p, end, line);
    if (v - v !== 0) this.noteNonFinite(this.nextRow + 1, this.nextCol + 1, line);
    this.storeArrayValue(v);
  }

  private noteNonFinite(row: number, col: number, line: number): void {
    if (this.nonFiniteLines++ < NON_FINITE_LISTED) this.nonFinite.push({ row, col, line });
  }

  /** Place the next value of an array file (column-major; symmetric: rows j..n−1 of column j). */
  private storeArrayValue(v: number): void {
    const i = this.nextRow;
    const j = this.nextCol;
    // advance down the column (symmetric arrays hold rows j..n−1 of column j)
    if (++this.nextRow === this.size!.rows) {
      this.nextCol++;
      this.nextRow = this.symmetric ? this.nextCol : 0;
    }
    this.count++;
    if (this.mode === 'dense') {
      this.dense[i + j * this.size!.rows] = v;
    } else if (v !== 0) {
      if (this.stored === this.rows.length) this.grow();
      const k = this.stored++;
      this.rows[k] = i;
      this.cols[k] = j;
      this.vals[k] = v;
    }
  }

  private index(buf: Buffer, p: number, end: number, line: number, which: string): number {
    const v = scanUnsigned(buf, p, end);
    if (scan.status === SCAN_OK && v >= 1 && v <= this.n) return v;
    const text = tokenText(buf, p, end);
    let why: string;
    if (buf[p] === 45) why = `${which} index ${text} is negative; indices are 1-based`;
    else if (scan.status === SCAN_OK && v === 0) why = `${which} index 0 is not allowed; indices are 1-based`;
    else if (scan.status === SCAN_OK || scan.status === SCAN_TOO_LARGE) why = `${which} index ${text} is outside 1..${this.n}`;
    else if (scan.status === SCAN_NOT_INTEGER) why = `${which} index '${text}' is not a whole number`;
    else why = `expected 'row column value' but the ${which} index is '${text}'`;
    throw new InputError(this.file, why, { line });
  }

  private value(buf: Buffer, p: number, end: number, line: number): number {
    const record = this.options.screening === 'record' && this.mode === 'triplets';
    let v = scanReal(buf, p, end);
    if (scan.status !== SCAN_OK) {
      const text = tokenText(buf, p, end);
      const special = /^([+-]?)(inf|infinity|nan)$/i.exec(text);
      if (record && special) {
        // kept for the matrix-finite rule; the rest of the line is checked as for any value
        v = special[2].toLowerCase() === 'nan' ? NaN : special[1] === '-' ? -Infinity : Infinity;
        const q = skipBlanks(buf, p + text.length, end);
        if (q !== end) throw new InputError(this.file, `unexpected text ${quoteText(buf.toString('latin1', q, end), 30)} after the value`, { line });
        return v;
      }
      const why = /^[+-]?(inf|infinity|nan)$/i.test(text)
        ? `value '${text}' is not a finite number`
        : `value '${text}' is not a number`;
      throw new InputError(this.file, why, { line });
    }
    if (v - v !== 0 && !record) {
      throw new InputError(this.file, `value '${tokenText(buf, p, end)}' is too large for double precision (not finite)`, { line });
    }
    if (this.integer && scan.hadFraction) {
      throw new InputError(this.file, `the banner says 'integer' but value '${tokenText(buf, p, end)}' is not a whole number`, { line });
    }
    const q = skipBlanks(buf, scan.end, end);
    if (q !== end) {
      throw new InputError(this.file, `unexpected text ${quoteText(buf.toString('latin1', q, end), 30)} after the value`, { line });
    }
    return v;
  }
}

/** Mode shapes are dense real arrays. */
function checkForDenseArray(file: string, b: MatrixMarketBanner): void {
  if (b.format !== 'array' || (b.field !== 'real' && b.field !== 'integer') || b.symmetry !== 'general') {
    throw new InputError(
      file,
      `a dense array file must be 'array real general'; this one is '${b.format} ${b.field} ${b.symmetry}'`,
      { line: 1 },
    );
  }
}
