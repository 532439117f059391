/**
 * The full-size versions of the reader's hardening cases (test/io/hardening*.test.ts run them
 * scaled down). Run once by hand after `npm run build`:
 *
 *   node dist/test/io/full-size-hardening.js [workdir]
 *
 * It writes, in a temporary folder (or workdir):
 *   huge.mtx          114 bytes declaring 10⁹ × 10⁹ with 3 entries;
 *   repeat.mtx.gz     one entry repeated ~1.1·10⁸ times (≈ 0.9 MB compressed, ≈ 0.9 GB of text);
 *   blank.mtx.gz      a header then 2.2 GB of blank lines (≈ 2 MB compressed);
 * and runs `inspect` (and `modes`/`check` on the first) through /usr/bin/time, printing exit
 * code, wall time, peak memory and the first stderr line of each. Nothing is asserted: it is a
 * measurement to quote, not a test.
 */
import { execFile } from 'node:child_process';
import { createWriteStream, existsSync, mkdtempSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createGzip } from 'node:zlib';
import { once } from 'node:events';

const here = dirname(fileURLToPath(import.meta.url));
const mainJs = resolve(here, '../../src/cli/main.js');
const work = process.argv[2] ?? mkdtempSync(join(tmpdir(), 'modalgate-full-size-'));
const BANNER = '%%MatrixMarket matrix coordinate real symmetric\n';

/** Write `head`, then `chunk` `times` times, then `tail`, gzip-compressed (level 9). */
async function writeGzip(path: string, head: string, chunk: Buffer, times: number, tail: string): Promise<void> {
  const gz = createGzip({ level: 9 });
  const out = createWriteStream(path);
  gz.pipe(out);
  gz.write(head);
  for (let k = 0; k < times; k++) {
    if (!gz.write(chunk)) await once(gz, 'drain');
  }
  gz.end(tail);
  await once(out, 'close');
}

function run(args: string[]): Promise<string> {
  return new Promise((done) => {
    const t0 = performance.now();
    execFile('/usr/bin/time', ['-f', 'MAXRSS_KB=%M', process.execPath, mainJs, ...args], { cwd: work, maxBuffer: 1 << 24 }, (err, _stdout, stderr) => {
      const seconds = (performance.now() - t0) / 1000;
      const rss = /MAXRSS_KB=(\d+)/.exec(stderr);
      const first = stderr.split('\n').find((l) => l.startsWith('modalgate:')) ?? '(no message)';
      const code = err ? (err as { code?: number }).code : 0;
      done(`${args[0]} ${args.slice(1).join(' ')}\n  exit ${code}, ${seconds.toFixed(1)} s, peak ${rss ? (Number(rss[1]) / 1024).toFixed(0) : '?'} MB\n  ${first.slice(0, 300)}`);
    });
  });
}

async function main(): Promise<void> {
  if (!existsSync('/usr/bin/time')) throw new Error('needs /usr/bin/time');
  const huge = join(work, 'huge.mtx');
  writeFileSync(huge, `${BANNER}1000000000 1000000000 3\n1 1 1.0\n2 2 1.0\n3 3 1.0\n`);
  const m3 = join(work, 'm3.mtx');
  writeFileSync(m3, `${BANNER}3 3 3\n1 1 1.0\n2 2 1.0\n3 3 1.0\n`);
  const cfg = join(work, 'huge.yaml');
  writeFileSync(cfg, `models:\n  - name: huge\n    stiffness: ${huge}\n    mass: ${m3}\n    ruleSets: [supported]\n    rules:\n      first-elastic-frequency: { minHz: 1 }\n`);

  // one entry, 110 000 000 times: "2 1 0.5\n" is 8 bytes
  const repeats = 110_000_000;
  const repeat = join(work, 'repeat.mtx.gz');
  if (!existsSync(repeat)) {
    const block = Buffer.from('2 1 0.5\n'.repeat(1_000_000));
    await writeGzip(repeat, `${BANNER}3 3 ${repeats + 3}\n1 1 1\n2 2 1\n3 3 1\n`, block, repeats / 1_000_000, '');
  }
  // 2.2 GB of "\n"
  const blank = join(work, 'blank.mtx.gz');
  if (!existsSync(blank)) await writeGzip(blank, `${BANNER}3 3 3\n`, Buffer.alloc(1 << 24, 10), Math.round(2.2e9 / (1 << 24)), '1 1 1\n2 2 1\n3 3 1\n');

  const lines = [
    `files in ${work}: huge.mtx ${statSync(huge).size} B, repeat.mtx.gz ${statSync(repeat).size} B, blank.mtx.gz ${statSync(blank).size} B`,
    await run(['inspect', huge]),
    await run(['modes', '--stiffness', huge, '--mass', m3]),
    await run(['check', '-c', cfg, '--junit', join(work, 'huge-junit.xml'), '--quiet']),
    await run(['inspect', repeat]),
    await run(['inspect', blank]),
  ];
  process.stdout.write(`${lines.join('\n')}\n`);
}

await main();
