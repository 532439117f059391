/**
 * Read a DOF map CSV (our own side-file format, see ./dof-map.ts):
 *
 *   dof,node,component,x,y,z
 *   1,101,ux,0,0,0
 *
 * `dof` is the 1-based row of K; `component` one of ux uy uz rx ry rz (any case); x y z the
 * node's coordinates. Checked: every row 1..n listed exactly once, positive whole node ids,
 * known components, finite coordinates, one (node, component) per DOF, and the same
 * coordinates on every line of a node (compared exactly: they come from one number).
 * Blank lines are ignored. Streams the file line by line.
 */
import { COMPONENTS, type DofMap } from './dof-map.js';
import { InputError } from './errors.js';
import { forEachLine } from './byte-lines.js';
import { printable } from './matrix-market-header.js';

const HEADER = ['dof', 'node', 'component', 'x', 'y', 'z'];
const WHOLE = /^\+?\d+$/;
const REAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

class DofMapBuilder {
  n = 0;
  node = new Int32Array(0);
  component = new Uint8Array(0);
  x = new Float64Array(0);
  y = new Float64Array(0);
  z = new Float64Array(0);
  /** Line of each DOF (0 = not seen yet). */
  lineOf = new Int32Array(0);
  headerSeen = false;
  firstDofOfNode = new Map<number, number>();
  dofOfNodeComponent = new Map<number, number>();

  constructor(
    readonly file: string,
    readonly expectedN: number | undefined,
  ) {
    if (expectedN !== undefined) this.resize(expectedN);
  }

  resize(cap: number): void {
    const grow = <T extends Int32Array | Uint8Array | Float64Array>(a: T, make: (c: number) => T): T => {
      const b = make(cap);
      b.set(a.subarray(0, Math.min(a.length, cap)));
      return b;
    };
    this.node = grow(this.node, (c) => new Int32Array(c));
    this.component = grow(this.component, (c) => new Uint8Array(c));
    this.x = grow(this.x, (c) => new Float64Array(c));
    this.y = grow(this.y, (c) => new Float64Array(c));
    this.z = grow(this.z, (c) => new Float64Array(c));
    this.lineOf = grow(this.lineOf, (c) => new Int32Array(c));
  }

  fail(reason: string, line: number): never {
    throw new InputError(this.file, reason, { line });
  }

  readonly onLine = (buf: Buffer, start: number, end: number, line: number): void => {
    let text = buf.toString('utf8', start, end);
    if (line === 1 && text.charCodeAt(0) === 0xfeff) text = text.slice(1); // byte-order mark
    if (text.trim() === '') return;
    text = printable(text); // valid fields are ASCII; keeps messages one clean line
    const fields = text.split(',').map((f) => f.trim());
    if (!this.headerSeen) {
      if (fields.length !== 6 || fields.some((f, k) => f.toLowerCase() !== HEADER[k])) {
        // quoted only when it looks like our header: a path pointing at another file must not leak its first line
        const found = /^\s*dof\s*,/i.test(text) ? `found '${text.slice(0, 60)}'` : 'the line found is not quoted, as it does not start with dof,';
        this.fail(`the first line must be the header 'dof,node,component,x,y,z'; ${found}`, line);
      }
      this.headerSeen = true;
      return;
    }
    if (fields.length !== 6) this.fail(`expected 6 comma-separated fields (dof,node,component,x,y,z); found ${fields.length}`, line);
    this.addRow(fields, line);
  };

  addRow(f: string[], line: number): void {
    const [dofText, nodeText, compText] = f;
    if (!WHOLE.test(dofText)) this.fail(`dof '${dofText}' is not a whole number`, line);
    const dof = Number(dofText);
    if (dof < 1 || (this.expectedN !== undefined && dof > this.expectedN)) {
      const range = this.expectedN !== undefined ? `1..${this.expectedN} (the rows of K)` : '1 or more';
      this.fail(`dof ${dofText} is outside ${range}`, line);
    }
    if (dof > 2 ** 30) this.fail(`dof ${dofText} is too large`, line);
    if (!WHOLE.test(nodeText) || Number(nodeText) < 1 || Number(nodeText) > 2147483647) {
      this.fail(`node '${nodeText}' is not a positive whole number`, line);
    }
    const node = Number(nodeText);
    // a component by name (ux … rz, any case) or by number 1 … 6 in the same order
    const comp = /^[1-6]$/.test(compText) ? Number(compText) - 1 : COMPONENTS.indexOf(compText.toLowerCase() as (typeof COMPONENTS)[number]);
    if (comp < 0) this.fail(`unknown component '${compText}' (expected one of ${COMPONENTS.join(' ')}, or 1 to 6)`, line);
    const xyz = [f[3], f[4], f[5]].map((t, k) => {
      const v = Number(t);
      if (!REAL.test(t) || !Number.isFinite(v)) this.fail(`coordinate ${'xyz'[k]} '${t}' is not a finite number`, line);
      return v;
    });
    const d = dof - 1;
    if (d >= this.lineOf.length) this.resize(Math.max(d + 1, this.lineOf.length * 2, 1024));
    if (this.lineOf[d] !== 0) this.fail(`dof ${dof} is listed twice (first on line ${this.lineOf[d]})`, line);
    const key = node * 8 + comp;
    const other = this.dofOfNodeComponent.get(key);
    if (other !== undefined) this.fail(`node ${node} ${COMPONENTS[comp]} is already dof ${other + 1} (line ${this.lineOf[other]})`, line);
    this.dofOfNodeComponent.set(key, d);
    const first = this.firstDofOfNode.get(node);
    if (first === undefined) this.firstDofOfNode.set(node, d);
    else if (this.x[first] !== xyz[0] || this.y[first] !== xyz[1] || this.z[first] !== xyz[2]) {
      this.fail(
        `node ${node} has coordinates (${xyz.join(', ')}) here but (${this.x[first]}, ${this.y[first]}, ${this.z[first]}) on line ${this.lineOf[first]}`,
        line,
      );
    }
    this.lineOf[d] = line;
    this.node[d] = node;
    this.component[d] = comp;
    this.x[d] = xyz[0];
    this.y[d] = xyz[1];
    this.z[d] = xyz[2];
    if (dof > this.n) this.n = dof;
  }

  finish(lastLine: number): DofMap {
    if (!this.headerSeen) this.fail('the file is empty (expected the header dof,node,component,x,y,z)', 1);
    const n = this.expectedN ?? this.n;
    if (n === 0) this.fail('the map lists no DOFs', lastLine);
    // every row of K must have its line
    for (let d = 0; d < n; d++) {
      if (this.lineOf[d] === 0) {
        this.fail(`dof ${d + 1} is missing: the map must list every row of K (1..${n}) exactly once`, lastLine);
      }
    }
    if (this.lineOf.length !== n) this.resize(n);
    return { n, node: this.node, component: this.component, x: this.x, y: this.y, z: this.z };
  }
}

/** The DOF map of a model; `expectedN` (rows of K) makes every row 1..n required. */
export async function readDofMap(path: string, expectedN?: number): Promise<DofMap> {
  const builder = new DofMapBuilder(path, expectedN);
  const scanned = await forEachLine(path, builder.onLine);
  return builder.finish(Math.max(1, scanned.lines));
}
