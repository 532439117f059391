/**
 * The header of a Matrix Market file (NIST, Boisvert, Pozo & Remington, "The Matrix Market
 * Exchange Formats: Initial Design", NISTIR 5935, 1996):
 *
 *   %%MatrixMarket matrix <coordinate|array> <real|integer|complex|pattern> <general|symmetric|skew-symmetric|hermitian>
 *   % comment lines (any number), blank lines
 *   rows cols entries        (coordinate)      rows cols        (array)
 *
 * The `%%MatrixMarket` token is compared exactly, the four qualifiers without regard to case
 * (as the NIST reference reader does). Which combinations a caller accepts is its own choice:
 * see `checkForStructuralMatrix` (stiffness/mass) and the dense-array reader.
 */
import { InputError } from './errors.js';

export type MatrixFormat = 'coordinate' | 'array';
export type MatrixField = 'real' | 'integer' | 'complex' | 'pattern';
export type MatrixSymmetry = 'general' | 'symmetric' | 'skew-symmetric' | 'hermitian';

export interface MatrixMarketBanner {
  format: MatrixFormat;
  field: MatrixField;
  symmetry: MatrixSymmetry;
}

export interface MatrixMarketSize {
  rows: number;
  cols: number;
  /** Declared entries (coordinate) or rows·cols / n(n+1)/2 values (array). */
  entries: number;
  /** Line number of the size line. */
  line: number;
}

const BANNER = '%%MatrixMarket';
const FORMATS = ['coordinate', 'array'];
const FIELDS = ['real', 'integer', 'complex', 'pattern'];
const SYMMETRIES = ['general', 'symmetric', 'skew-symmetric', 'hermitian'];

/** Shortened text for messages. */
export function quoteText(s: string, max = 60): string {
  const t = printable(s.trim());
  return `'${t.length > max ? `${t.slice(0, max)}…` : t}'`;
}

/** Control and non-ASCII bytes shown as '?', so a message stays one clean line. */
export function printable(s: string): string {
  return s.replace(/[^\x20-\x7e]/g, '?');
}

/**
 * Line 1 quoted in a message only when it looks like a banner (starts with %%MatrixMarket,
 * any case): a path that points at some other file (a system file, a key) must not have its
 * first line copied into every report.
 */
function quoteBanner(text: string): string {
  return /^\s*%%?matrixmarket/i.test(text) ? `found ${quoteText(text)}` : 'line 1 is not a Matrix Market banner (not quoted)';
}

/** Parse and validate line 1. */
export function parseBanner(file: string, text: string): MatrixMarketBanner {
  const words = text.trim().split(/\s+/);
  if (words[0] !== BANNER) {
    const hint = /^%%?matrixmarket$/i.test(words[0] ?? '')
      ? `the banner must start with '${BANNER}' exactly`
      : `line 1 must be the Matrix Market banner, e.g. '${BANNER} matrix coordinate real symmetric'`;
    throw new InputError(file, `${hint}; ${quoteBanner(text)}`, { line: 1 });
  }
  if (words.length !== 5) {
    throw new InputError(
      file,
      `the banner needs exactly four words after ${BANNER} (object, format, field, symmetry); ${quoteBanner(text)}`,
      { line: 1 },
    );
  }
  const [object, format, field, symmetry] = words.slice(1).map((w) => w.toLowerCase());
  if (object !== 'matrix') {
    throw new InputError(file, `the banner describes a ${quoteText(words[1], 30)}, but only 'matrix' objects can be read`, { line: 1 });
  }
  if (!FORMATS.includes(format)) {
    throw new InputError(file, `unknown format ${quoteText(words[2], 30)} in the banner (expected coordinate or array)`, { line: 1 });
  }
  if (!FIELDS.includes(field)) {
    throw new InputError(file, `unknown field ${quoteText(words[3], 30)} in the banner (expected real, integer, complex or pattern)`, { line: 1 });
  }
  if (!SYMMETRIES.includes(symmetry)) {
    throw new InputError(
      file,
      `unknown symmetry ${quoteText(words[4], 30)} in the banner (expected general, symmetric, skew-symmetric or hermitian)`,
      { line: 1 },
    );
  }
  return { format: format as MatrixFormat, field: field as MatrixField, symmetry: symmetry as MatrixSymmetry };
}

/** Stiffness and mass matrices are real symmetric with values: say why anything else is refused. */
export function checkForStructuralMatrix(file: string, b: MatrixMarketBanner): void {
  const why =
    b.field === 'complex'
      ? 'complex values cannot form a stiffness or mass matrix, which are real'
      : b.field === 'pattern'
        ? "a 'pattern' file holds only positions, but a stiffness or mass matrix needs its values"
        : b.symmetry === 'hermitian'
          ? "'hermitian' symmetry belongs to complex matrices; stiffness and mass matrices are real symmetric"
          : b.symmetry === 'skew-symmetric'
            ? "a 'skew-symmetric' matrix cannot be a stiffness or mass matrix, which are symmetric"
            : undefined;
  if (why) throw new InputError(file, why, { line: 1 });
}

/** Parse the size line: two (array) or three (coordinate) whole numbers, else InputError. */
export function parseSizeLine(file: string, text: string, line: number, format: MatrixFormat): MatrixMarketSize {
  const words = text.trim().split(/\s+/);
  const want = format === 'coordinate' ? 3 : 2;
  const what = format === 'coordinate' ? "'rows columns entries'" : "'rows columns'";
  if (words.length !== want || !words.every((w) => /^\+?\d+$/.test(w))) {
    throw new InputError(file, `the size line must hold ${want} whole numbers ${what}; found ${quoteText(text)}`, { line });
  }
  const [rows, cols, declared] = words.map((w) => Number(w));
  if (!words.every((w) => Number(w) <= Number.MAX_SAFE_INTEGER)) {
    throw new InputError(file, `the size line holds a number too large to be real: ${quoteText(text)}`, { line });
  }
  return { rows, cols, entries: format === 'coordinate' ? declared : rows * cols, line };
}
