/**
 * A baseline is one unit (src/model/baseline-store.ts): metadata and shapes of one save belong
 * together, and the loader refuses a mix.
 *  - the files of a save carry its run id; the JSON records each data file's SHA-256; DOF numbers
 *    of a stored subset are 1-based;
 *  - a JSON of one save beside the shapes of another (made here on purpose, deterministically:
 *    the state a kill between two renames of the old layout left) is refused with a sentence
 *    naming both files; a missing data file likewise;
 *  - data files written by a save that never committed its JSON (a kill before the commit) do
 *    not change what loads;
 *  - two saves into one directory at once never leave a mix: one of them wins whole, the other's
 *    data files are gone, and no `.tmp` file or lock is left;
 *  - a lock left by a dead process is broken;
 *  - a failed save never throws out of runBaselineSave, and a model whose verdict is error is
 *    not saved.
 * Modes: exact modes of spring–mass chains (ml-matrix, outside the project, test/rules/fake-model.ts).
 */
import { afterAll, describe, expect, it } from 'vitest';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { exactModes, springChain } from '../rules/fake-model.js';
import { baselineLockFile, loadBaseline, saveBaseline, type BaselineSnapshot } from '../../src/model/baseline-store.js';
import { runBaselineSave } from '../../src/pipeline/baseline-step.js';
import type { ModelJob } from '../../src/pipeline/job-types.js';
import type { RuleContext } from '../../src/rules/rule-types.js';

const work = mkdtempSync(join(tmpdir(), 'modalgate-store-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

const chainA = springChain(6, 1000, [1, 1.3, 0.8, 1.1, 0.9, 1.2], 1000);
const chainB = springChain(6, 1000, [1, 1.3, 0.8, 1.1, 0.9, 1.5], 1000);
const modesA = exactModes(chainA);
const modesB = exactModes(chainB);

function snapshotOf(dir: string, model: string): BaselineSnapshot {
  return JSON.parse(readFileSync(join(dir, `${model}.baseline.json`), 'utf8')) as BaselineSnapshot;
}

function leftovers(dir: string): string[] {
  return readdirSync(dir).filter((f) => f.endsWith('.tmp') || f.endsWith('.lock') || f.includes('.stale'));
}

describe('baseline unit', () => {
  it('names its data files by run id, records their checksums and stores DOFs 1-based', async () => {
    const dir = join(work, 'named');
    const files = await saveBaseline(dir, { model: 'chain', modes: modesA, mass: chainA.mass, selection: 'auto', maxDofs: 4 });
    const s = snapshotOf(dir, 'chain');
    expect(s.schemaVersion).toBe(2);
    expect(s.runId).toMatch(/^[0-9a-f]{16}$/);
    expect(s.shapes.file).toBe(`chain.${s.runId}.shapes.mtx.gz`);
    expect(files.shapes).toBe(join(dir, s.shapes.file));
    expect(s.shapes.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(s.shapes.dofs).toHaveLength(4);
    expect(Math.min(...s.shapes.dofs!)).toBeGreaterThanOrEqual(1);
    expect(s.shapes.energyShareKept).toBeGreaterThan(0);
    expect(s.shapes.energyShareKept).toBeLessThan(1);
    const loaded = (await loadBaseline(dir, 'chain'))!;
    expect(Array.from(loaded.dofs!)).toEqual(s.shapes.dofs!.map((d) => d - 1));
    // the default keeps every DOF
    await saveBaseline(dir, { model: 'chain', modes: modesA, mass: chainA.mass });
    const all = snapshotOf(dir, 'chain');
    expect(all.shapes.selection).toBe('all');
    expect(all.shapes.dofs).toBeUndefined();
    expect(all.shapes.energyShareKept).toBe(1);
    // the older unit's data file was removed after the commit
    expect(readdirSync(dir).filter((f) => f.endsWith('.shapes.mtx.gz'))).toEqual([all.shapes.file]);
    expect(leftovers(dir)).toEqual([]);
  });

  it('refuses the metadata of one save beside the shapes of another', async () => {
    const [dirA, dirB] = [join(work, 'mixA'), join(work, 'mixB')];
    await saveBaseline(dirA, { model: 'chain', modes: modesA, mass: chainA.mass });
    await saveBaseline(dirB, { model: 'chain', modes: modesB, mass: chainB.mass });
    const a = snapshotOf(dirA, 'chain'), b = snapshotOf(dirB, 'chain');
    // B's shapes under the name A's metadata points at
    copyFileSync(join(dirB, b.shapes.file), join(dirA, a.shapes.file));
    const json = join(dirA, 'chain.baseline.json');
    await expect(loadBaseline(dirA, 'chain')).rejects.toThrow(`${json}: does not belong with its shapes file ${join(dirA, a.shapes.file)}`);
    await expect(loadBaseline(dirA, 'chain')).rejects.toThrow(`recorded by run ${a.runId}, so the baseline mixes two saves; save it again with check --save-baseline`);
    rmSync(join(dirA, a.shapes.file));
    await expect(loadBaseline(dirA, 'chain')).rejects.toThrow(`${json}: its shapes file ${join(dirA, a.shapes.file)} is missing (run ${a.runId})`);
  });

  it('data files of a save that never committed do not change what loads', async () => {
    const [dirA, dirB] = [join(work, 'killedA'), join(work, 'killedB')];
    await saveBaseline(dirA, { model: 'chain', modes: modesA, mass: chainA.mass });
    await saveBaseline(dirB, { model: 'chain', modes: modesB, mass: chainB.mass });
    const b = snapshotOf(dirB, 'chain');
    copyFileSync(join(dirB, b.shapes.file), join(dirA, b.shapes.file));
    const loaded = (await loadBaseline(dirA, 'chain'))!;
    expect(loaded.snapshot.frequenciesHz).toEqual(Array.from(modesA.frequenciesHz));
    expect(loaded.shapes.values[0]).toBe(modesA.shapes[0]);
  });

  it('two saves at once leave one whole unit and nothing else', async () => {
    const dir = join(work, 'race');
    for (let round = 0; round < 3; round++) {
      await Promise.all([
        saveBaseline(dir, { model: 'chain', modes: modesA, mass: chainA.mass }),
        saveBaseline(dir, { model: 'chain', modes: modesB, mass: chainB.mass }),
      ]);
      const loaded = (await loadBaseline(dir, 'chain'))!;
      const winner = loaded.snapshot.frequenciesHz[5] === modesA.frequenciesHz[5] ? modesA : modesB;
      expect(loaded.snapshot.frequenciesHz).toEqual(Array.from(winner.frequenciesHz));
      expect(Array.from(loaded.shapes.values)).toEqual(Array.from(winner.shapes));
      // the winner's shapes and M·shapes (every DOF kept), no file of the other save
      expect(readdirSync(dir).sort()).toEqual([`chain.${loaded.snapshot.runId}.shapes.mtx.gz`, `chain.${loaded.snapshot.runId}.mass-shapes.mtx.gz`, 'chain.baseline.json'].sort());
    }
  });

  it('breaks a lock left by a process that no longer runs', async () => {
    const dir = join(work, 'stale');
    mkdirSync(dir, { recursive: true });
    const dead = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], { encoding: 'utf8' });
    writeFileSync(baselineLockFile(dir, 'chain'), `${dead.stdout}\n`);
    await saveBaseline(dir, { model: 'chain', modes: modesA, mass: chainA.mass });
    expect(existsSync(join(dir, 'chain.baseline.json'))).toBe(true);
    expect(leftovers(dir)).toEqual([]);
  });

  it('a failed save comes back as an error naming the file and the cause; an errored model is not saved', async () => {
    const dir = join(work, 'fails');
    mkdirSync(join(dir, 'chain.baseline.json'), { recursive: true }); // a directory where the JSON goes
    const job = { name: 'chain', configPath: join(work, 'c.yaml'), where: 'models[0]', baseline: { saveDir: dir, where: 'baseline' } } as unknown as ModelJob;
    const context = { modelName: 'chain', mass: chainA.mass, modes: modesA } as unknown as RuleContext;
    const failed = await runBaselineSave(job, context, 'pass');
    expect(failed.saved).toBeUndefined();
    expect(failed.failure?.message).toContain(`${dir}: could not save the baseline of model "chain": EISDIR`);
    expect(failed.failure?.message).toContain(join(dir, 'chain.baseline.json'));
    expect(readdirSync(dir)).toEqual(['chain.baseline.json']); // no data file, no .tmp, no lock left
    const other = join(work, 'errored');
    const skipped = await runBaselineSave({ ...job, baseline: { saveDir: other, where: 'baseline' } } as ModelJob, context, 'error');
    expect(skipped.notSaved).toBe("baseline of chain not saved: the model's verdict is error (a rule could not be evaluated)");
    expect(existsSync(other)).toBe(false);
  });
});
