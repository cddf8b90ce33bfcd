/** Rows bucketed by a key in one pass (Node 20 has no Map.groupBy), so per-row look-ups stay O(1). */
export function groupBy<T, K>(rows: Iterable<T>, key: (row: T) => K): Map<K, T[]> {
  const map = new Map<K, T[]>();
  for (const row of rows) {
    const k = key(row);
    const list = map.get(k);
    if (list) list.push(row);
    else map.set(k, [row]);
  }
  return map;
}
