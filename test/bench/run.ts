/**
 * `npm run bench`: runs every `*-bench.js` module next to this file (compiled from
 * test/bench/*-bench.ts), in name order. Each module's default export is an async function
 * that prints its own measurements. `npm run bench -- reader sparse` runs only the modules
 * whose names contain one of the given words.
 */
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const filters = process.argv.slice(2);
const modules = readdirSync(here)
  .filter((f) => f.endsWith('-bench.js'))
  .filter((f) => filters.length === 0 || filters.some((w) => f.includes(w)))
  .sort();

if (modules.length === 0) console.log('no benchmark modules matched');
for (const file of modules) {
  console.log(`\n=== ${file.replace(/\.js$/, '')} ===`);
  const mod = (await import(pathToFileURL(join(here, file)).href)) as { default: () => Promise<void> };
  await mod.default();
}
