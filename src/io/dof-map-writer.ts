/** Write a DOF map CSV (header `dof,node,component,x,y,z`, one line per DOF), atomically. */
import { COMPONENTS, type DofMap } from './dof-map.js';
import { batchLines, writeChunksAtomic } from './atomic-stream-write.js';
import { formatReal } from './matrix-market-writer.js';

export async function writeDofMap(path: string, map: DofMap, options: { gzip?: boolean } = {}): Promise<void> {
  await writeChunksAtomic(path, batchLines(dofMapLines(map)), { gzip: options.gzip });
}

function* dofMapLines(map: DofMap): Generator<string> {
  yield 'dof,node,component,x,y,z\n';
  // one line per DOF, 1-based
  for (let d = 0; d < map.n; d++) {
    yield `${d + 1},${map.node[d]},${COMPONENTS[map.component[d]]},${formatReal(map.x[d])},${formatReal(map.y[d])},${formatReal(map.z[d])}\n`;
  }
}
