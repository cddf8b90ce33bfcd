import type { AnimalListQuery, HerdSortKey } from '@burrowline/shared';

/**
 * The herd list as SQL: filter, sort and page over the farm's own rows, so only the page is read in full
 * and presented. The sorts kept on `animals` match the herd indexes key for key (migration
 * 0035-list-indexes), so a page is read in index order; the breed and COI sorts look up the figures of the
 * farm's rows one by one (scalar sub-queries are never turned into a join over the whole co-op's figures).
 */

/** Tattoos and names sort as people read them: HR-2 before HR-10, capitals beside small letters. */
export const naturalOrder = 'COLLATE natural_order';

const lifecycleRank = `(CASE a.lifecycle WHEN 'kit' THEN 0 WHEN 'junior' THEN 1 WHEN 'breeding' THEN 2 ELSE 3 END)`;

/** The breed with the largest share of the make-up (its name), none when the ancestry is unknown. */
const leadingBreed = `(SELECT COALESCE(b.name, 'A removed breed') ${naturalOrder}
  FROM animal_breed_makeups mk CROSS JOIN LATERAL jsonb_each(mk.breeds) share LEFT JOIN breeds b ON b.id = share.key::uuid
  WHERE mk.animal_id = a.id AND mk.purity <> 'unknown'
  ORDER BY share.value::float8 DESC, b.name LIMIT 1)`;

const sortKeys: Record<HerdSortKey, string | null> = {
  tattoo: null,
  name: `a.name ${naturalOrder}`,
  sex: 'a.sex',
  birthDate: 'a.birth_date',
  lifecycle: lifecycleRank,
  hutch: `a.hutch ${naturalOrder}`,
  breed: leadingBreed,
  coi: '(SELECT COALESCE(i.coi, 0) FROM animal_inbreeding i WHERE i.animal_id = a.id)',
};

/**
 * The class rule (4 or 6 show classes) of animal `a`, as the presenter derives it: a purebred follows its
 * breed, another animal its declared breed, else its largest share; four when nothing is known.
 */
const classRule = `(SELECT COALESCE(std.show_class_count, largest.show_class_count, 4)
  FROM (SELECT 1) one
  LEFT JOIN animal_breed_makeups mk ON mk.animal_id = a.id
  LEFT JOIN breeds std ON std.id = CASE WHEN mk.purity = 'purebred' THEN (SELECT k::uuid FROM jsonb_object_keys(mk.breeds) k LIMIT 1) ELSE a.breed_id END
  LEFT JOIN LATERAL (
    SELECT b.show_class_count FROM jsonb_each(mk.breeds) share LEFT JOIN breeds b ON b.id = share.key::uuid
    ORDER BY share.value::float8 DESC LIMIT 1
  ) largest ON true)`;

export interface HerdPageSql {
  /** The page's ids in order (`id`, `position`) with the count of all matching rows (`total`), to be joined to the figures. */
  pageSql: string;
  pageBind: unknown[];
  /** The count alone, for a page past the end (which has no row to carry it). */
  countSql: string;
  countBind: unknown[];
}

/**
 * `$1` is the co-op, `$2` the farm; `today` is the farm's today (age classes move with it). Animals the farm
 * owns and animals lent to it are two branches, so each is read along its own index.
 */
export function herdPageSql(q: AnimalListQuery, coopId: string, farmId: string, today: string): HerdPageSql {
  const bind: unknown[] = [coopId, farmId];
  const param = (value: unknown, cast = '') => {
    bind.push(value);
    return `$${bind.length}${cast}`;
  };
  const where: string[] = ['a.coop_id = $1', 'a.deleted_at IS NULL', 'NOT a.is_outside'];
  if (q.status === 'current') where.push(`a.disposition = 'on_farm'`);
  else if (q.status === 'gone') where.push(`a.disposition <> 'on_farm'`);
  else if (q.status !== 'all') where.push(`a.disposition = 'on_farm'`, `a.lifecycle = ${param(q.status)}`);
  if (q.sex) where.push(`a.sex = ${param(q.sex)}`);
  if (q.purity) where.push(`(SELECT mk.purity FROM animal_breed_makeups mk WHERE mk.animal_id = a.id) = ${param(q.purity)}`);
  if (q.breedId) where.push(`(SELECT (mk.breeds -> ${param(q.breedId)}::text) IS NOT NULL FROM animal_breed_makeups mk WHERE mk.animal_id = a.id)`);
  if (q.search) {
    const p = param(`%${q.search.replace(/[\\%_]/g, '\\$&')}%`);
    where.push(`(a.name ILIKE ${p} OR a.tattoo ILIKE ${p} OR a.hutch ILIKE ${p} OR a.colour ILIKE ${p} OR a.registration_number ILIKE ${p})`);
  }
  if (q.ageClass) {
    const day = param(today, '::date');
    const sixMonths = `${day} >= a.birth_date + interval '6 months'`;
    const eightMonths = `${day} >= a.birth_date + interval '8 months'`;
    where.push(
      q.ageClass === 'junior' ? `NOT (${sixMonths})`
        : q.ageClass === 'intermediate' ? `${sixMonths} AND NOT (${eightMonths}) AND ${classRule} = 6`
          : `${sixMonths} AND (${eightMonths} OR ${classRule} <> 6)`,
    );
  }
  const filters = where.join(' AND ');
  // The lent-in index's own expression: no other index serves it, and its statistics say how few rows match.
  const lentIn = '(CASE WHEN a.owning_farm_id <> a.keeping_farm_id THEN a.keeping_farm_id END) = $2';
  const countBind = [...bind];
  const dir = q.dir === 'desc' ? 'DESC' : 'ASC';
  const key = sortKeys[q.sort];
  const keyColumn = key ? `${key} AS sort_key, ` : '';
  const branch = (farmClause: string) => `SELECT a.id, ${keyColumn}a.tattoo ${naturalOrder} AS tattoo_key FROM animals a WHERE ${farmClause} AND ${filters}`;
  const orderBy = [key ? `sort_key ${dir}` : null, `tattoo_key ${dir}`, `id ${dir}`].filter(Boolean).join(', ');
  const limit = param(q.pageSize, '::bigint');
  const offset = param((q.page - 1) * q.pageSize, '::bigint');
  const countSql = `SELECT ((SELECT count(*) FROM animals a WHERE a.owning_farm_id = $2 AND ${filters})
    + (SELECT count(*) FROM animals a WHERE ${lentIn} AND ${filters}))::int AS total`;
  // The page is read in the order of the sort's index, so a large herd costs no more than a small one but
  // for its count, taken beside it (the count's parameters are the page's first ones).
  // Each branch is cut to the rows up to the page's end in its own order (an index's, for the sorts kept on
  // `animals`), so only those are merged and sorted.
  const upToPageEnd = `ORDER BY ${orderBy} LIMIT ${limit} + ${offset}`;
  const pageSql = `SELECT id, (${countSql}) AS total, row_number() OVER () AS position FROM (
      SELECT matching.id FROM (
        (${branch('a.owning_farm_id = $2')} ${upToPageEnd})
        UNION ALL
        (${branch(lentIn)} ${upToPageEnd})
      ) matching
      ORDER BY ${orderBy} LIMIT ${limit} OFFSET ${offset}
    ) ordered`;
  return { pageSql, pageBind: bind, countSql, countBind };
}
