/**
 * Matching two numbered sets by a key: item i of the first set is paired with item j of the
 * second when they share a key that no other item on either side holds (a key held twice on a
 * side — coincident nodes when the key is a position — pairs nothing).
 */

/** match[i] = the item of the second set paired with item i of the first, or −1; `matched` counts the pairs. */
export function matchUniqueKeys<K>(
  count: number,
  keyOf: (i: number) => K,
  otherCount: number,
  otherKeyOf: (j: number) => K,
): { match: Int32Array; matched: number } {
  // key → the other set's item holding it, −1 when more than one does
  const other = new Map<K, number>();
  for (let j = 0; j < otherCount; j++) {
    const k = otherKeyOf(j);
    other.set(k, other.has(k) ? -1 : j);
  }
  const keys = Array.from({ length: count }, (_v, i) => keyOf(i));
  const held = new Map<K, number>();
  for (const k of keys) held.set(k, (held.get(k) ?? 0) + 1);
  const match = new Int32Array(count).fill(-1);
  let matched = 0;
  for (let i = 0; i < count; i++) {
    const j = other.get(keys[i]);
    if (j === undefined || j < 0 || held.get(keys[i])! > 1) continue;
    match[i] = j;
    matched++;
  }
  return { match, matched };
}
