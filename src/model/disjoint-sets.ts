/**
 * Disjoint sets over 0 … count − 1 (union–find with path halving): `find` gives a set's
 * representative, `join` merges two sets. Tarjan, "Efficiency of a good but not linear set union
 * algorithm", J. ACM 22 (1975); path halving after Tarjan & van Leeuwen (1984).
 */
export interface DisjointSets {
  find(x: number): number;
  join(a: number, b: number): void;
}

export function disjointSets(count: number): DisjointSets {
  const parent = Int32Array.from({ length: count }, (_v, k) => k);
  const find = (x: number): number => {
    // every visited entry skips to its grandparent
    while (parent[x] !== x) x = parent[x] = parent[parent[x]];
    return x;
  };
  return {
    find,
    join: (a, b) => {
      parent[find(a)] = find(b);
    },
  };
}
