/**
 * The folders of src/ import one way only (DEVELOPERS.md, "Architecture: folders follow the data"):
 * a folder may import from the folders below it in LAYERS and from itself, never from one above.
 * This reads every import (static `import`/`export … from`, dynamic `import()`) of every file in
 * src/ and lists each forbidden one with its file, so a cycle between folders cannot come back.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

/** Top to bottom: cli uses everything, dense and sparse use nothing above them, wasm (the WebAssembly encoder) nothing at all. */
const LAYERS = ['cli', 'report', 'pipeline', 'rules', 'model', 'eigen', 'io', 'sparse', 'dense', 'wasm'] as const;

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
const src = join(root, 'src');

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = join(dir, e.name);
    if (e.isDirectory()) return sourceFiles(p);
    return e.name.endsWith('.ts') ? [p] : [];
  });
}

/** Module specifiers of the file's imports and re-exports (with their line numbers). */
function importsOf(text: string): { specifier: string; line: number }[] {
  const out: { specifier: string; line: number }[] = [];
  const patterns = [/\bfrom\s*['"]([^'"]+)['"]/g, /\bimport\s*\(\s*['"]([^'"]+)['"]\s*\)/g, /^\s*import\s*['"]([^'"]+)['"]/gm];
  for (const re of patterns) {
    for (const m of text.matchAll(re)) out.push({ specifier: m[1], line: text.slice(0, m.index).split('\n').length });
  }
  return out;
}

/** The top folder of src/ a path lies in (`sparse` for src/sparse/ordering/x.ts), or null outside src/. */
function folderOf(path: string): string | null {
  const rel = relative(src, path);
  if (rel.startsWith('..') || !rel.includes(sep)) return null;
  return rel.split(sep)[0];
}

interface Edge {
  file: string;
  line: number;
  specifier: string;
  from: string;
  to: string;
}

function folderEdges(): Edge[] {
  const edges: Edge[] = [];
  for (const file of sourceFiles(src)) {
    const from = folderOf(file);
    if (from === null) continue;
    for (const { specifier, line } of importsOf(readFileSync(file, 'utf8'))) {
      if (!specifier.startsWith('.')) continue;
      const to = folderOf(resolve(dirname(file), specifier));
      if (to === null || to === from) continue;
      edges.push({ file: relative(root, file), line, specifier, from, to });
    }
  }
  return edges;
}

function rank(folder: string): number {
  return (LAYERS as readonly string[]).indexOf(folder);
}

describe('import directions between the folders of src/', () => {
  const edges = folderEdges();

  it('finds the imports it checks (the reader works)', () => {
    expect(edges.length).toBeGreaterThan(50);
    expect(edges.some((e) => e.from === 'cli' && e.to === 'report')).toBe(true);
  });

  it('knows every folder of src/', () => {
    const folders = readdirSync(src, { withFileTypes: true }).filter((e) => e.isDirectory()).map((e) => e.name);
    expect(folders.filter((f) => rank(f) < 0)).toEqual([]);
  });

  it('imports only downward (cli → report → pipeline → rules → model → eigen → io → sparse → dense → wasm)', () => {
    const wrong = edges.filter((e) => rank(e.to) < rank(e.from)).map((e) => `${e.file}:${e.line} (${e.from}) imports ${e.specifier} (${e.to})`);
    expect(wrong).toEqual([]);
  });

  // Implied by the two tests above (every folder ranked, every edge strictly downward); kept so a
  // change to the ranking that allowed sideways imports would still be caught here.
  it('has no cycle between folders', () => {
    const next = new Map<string, Set<string>>();
    for (const e of edges) {
      if (!next.has(e.from)) next.set(e.from, new Set());
      next.get(e.from)!.add(e.to);
    }
    // depth-first search; a grey folder met again closes a cycle
    const state = new Map<string, 'grey' | 'black'>();
    const cycles: string[] = [];
    const visit = (f: string, path: string[]): void => {
      state.set(f, 'grey');
      for (const g of next.get(f) ?? []) {
        if (state.get(g) === 'grey') {
          const cycle = [...path.slice(path.indexOf(g)), g];
          const witnesses = cycle.slice(0, -1).map((a, i) => edges.find((e) => e.from === a && e.to === cycle[i + 1])!);
          cycles.push(`${cycle.join(' → ')}: ${witnesses.map((e) => `${e.file}:${e.line} imports ${e.specifier}`).join('; ')}`);
        } else if (!state.has(g)) visit(g, [...path, g]);
      }
      state.set(f, 'black');
    };
    for (const f of next.keys()) if (!state.has(f)) visit(f, [f]);
    expect(cycles).toEqual([]);
  });
});
