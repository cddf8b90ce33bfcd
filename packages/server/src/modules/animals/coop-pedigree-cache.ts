import type { Transaction } from 'sequelize';
import { CoopPedigree } from '@burrowline/shared';
import { query } from './animal-queries';
import { loadPedigreeRows } from './pedigree-figures';

/**
 * Each co-op's pedigree (ids → sire, dam, F) kept in this process's memory, so comparing a doe with
 * bucks never reads the whole co-op's pedigree per request.
 *
 * - Loaded once per co-op, on first use.
 * - Checked on every use against the co-op's `pedigree_versions` counter, which every pedigree change
 *   bumps in its own transaction. So a change committed through any instance is seen on the next
 *   request here: one version behind, only the changed animals' rows are read and applied in place
 *   (their descendants' F recomputed); further behind, or when the change did not name its animals,
 *   the co-op's rows are read again and compared with what is kept, applying only the differences.
 * - The version is read before the rows, so what is kept is never older than the version it is
 *   labelled with (at worst newer, and the next check applies the same change again harmlessly).
 */
interface Kept {
  version: number;
  pedigree: CoopPedigree;
}

const kept = new Map<string, Kept>();
const refreshing = new Map<string, Promise<CoopPedigree>>();
/** Co-ops kept at most; the least recently used one is dropped beyond (it loads again when asked). */
const MAX_COOPS = 32;

interface PedigreeRowOfAnimal {
  id: string;
  sire_id: string | null;
  dam_id: string | null;
  deleted_at: Date | null;
}

/** The co-op's pedigree as of the current transaction's view of `pedigree_versions`. */
export async function coopPedigreeOf(coopId: string, tx: Transaction): Promise<CoopPedigree> {
  const [row] = await query<{ version: string; changed_ids: string[] | null }>(
    tx,
    'SELECT version, changed_ids FROM pedigree_versions WHERE coop_id = $1',
    [coopId],
  );
  const version = row ? Number(row.version) : 0;
  const current = kept.get(coopId);
  if (current && current.version >= version) {
    touch(coopId, current);
    return current.pedigree;
  }
  const key = `${coopId}:${version}`;
  const running = refreshing.get(key);
  if (running) return running;
  const refresh = (async () => {
    const pedigree = current && version === current.version + 1 && row?.changed_ids
      ? await applyChanged(coopId, tx, current.pedigree, row.changed_ids)
      : await loadOrDiff(coopId, tx, current?.pedigree ?? null);
    const latest = kept.get(coopId);
    if (!latest || latest.version < version) touch(coopId, { version, pedigree });
    return pedigree;
  })();
  refreshing.set(key, refresh);
  try {
    return await refresh;
  } finally {
    refreshing.delete(key);
  }
}

function touch(coopId: string, entry: Kept): void {
  kept.delete(coopId);
  kept.set(coopId, entry);
  while (kept.size > MAX_COOPS) kept.delete(kept.keys().next().value!);
}

async function applyChanged(coopId: string, tx: Transaction, pedigree: CoopPedigree, ids: string[]): Promise<CoopPedigree> {
  const rows = await query<PedigreeRowOfAnimal>(
    tx,
    'SELECT id, sire_id, dam_id, deleted_at FROM animals WHERE coop_id = $1 AND id = ANY($2::uuid[])',
    [coopId, ids],
  );
  pedigree.apply(
    rows.filter((r) => r.deleted_at === null).map((r) => ({ id: r.id, sireId: r.sire_id, damId: r.dam_id })),
    rows.filter((r) => r.deleted_at !== null).map((r) => r.id),
  );
  return pedigree;
}

/** Reads the co-op's rows; builds the pedigree, or applies only what differs from the kept one. */
async function loadOrDiff(coopId: string, tx: Transaction, pedigree: CoopPedigree | null): Promise<CoopPedigree> {
  const rows = await loadPedigreeRows(coopId, tx);
  if (!pedigree) return CoopPedigree.build(rows);
  const listed = new Set<string>();
  const changed = rows.filter((r) => {
    listed.add(r.id);
    const parents = pedigree.has(r.id) ? pedigree.parentsOf(r.id) : undefined;
    return !parents || parents.sireId !== r.sireId || parents.damId !== r.damId;
  });
  const removed = pedigree.rows().map((r) => r.id).filter((id) => !listed.has(id));
  pedigree.apply(changed, removed);
  return pedigree;
}
