/**
 * The breed or cross of a litter, as grow-out averages and the breed comparison group it: the sire's
 * breed × the dam's (the usual order of a cross's name, sire first — common practice). Two parents of
 * one breed make a purebred litter; a parent of unknown breed makes the litter one of unknown ancestry,
 * kept apart because such litters are not predictable.
 */
export const UNKNOWN_ANCESTRY = 'Unknown ancestry';

export interface CrossLabel {
  /** Stable grouping key: 'pure:<breed>', 'cross:<sire breed>|<dam breed>' or 'unknown'. */
  key: string;
  label: string;
  kind: 'purebred' | 'cross' | 'unknown';
}

export function crossLabel(sireBreed: string | null | undefined, damBreed: string | null | undefined): CrossLabel {
  const sire = sireBreed?.trim();
  const dam = damBreed?.trim();
  if (!sire || !dam) return { key: 'unknown', label: UNKNOWN_ANCESTRY, kind: 'unknown' };
  if (sire.toLowerCase() === dam.toLowerCase()) return { key: `pure:${sire.toLowerCase()}`, label: sire, kind: 'purebred' };
  return { key: `cross:${sire.toLowerCase()}|${dam.toLowerCase()}`, label: `${sire} × ${dam}`, kind: 'cross' };
}
