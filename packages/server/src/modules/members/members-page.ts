import type { MemberListView } from '@burrowline/shared';

/**
 * The roster as SQL: every person of the co-op with the status, farm and last sign-in the roster shows,
 * filtered, sorted and paged, so only the page's people are presented. `$1` is the co-op.
 */
const roster = `
  SELECT u.id, u.name, u.email, u.role, u.created_at,
    CASE WHEN u.disabled_at IS NOT NULL THEN 'disabled'
         WHEN u.password_hash IS NULL THEN CASE WHEN inv.id IS NULL THEN 'awaiting_password' ELSE 'invited' END
         ELSE 'active' END AS status,
    f.name AS farm_name,
    COALESCE(f.name, inv.farm_name, '') AS shown_farm,
    (SELECT max(e.created_at) FROM audit_events e
     WHERE e.actor_user_id = u.id AND e.action = 'sign_in.succeeded' AND e.coop_id = u.coop_id) AS last_sign_in_at
  FROM users u
  LEFT JOIN farms f ON f.id = u.farm_id
  LEFT JOIN LATERAL (
    SELECT i.id, COALESCE(i.new_farm_name, fi.name) AS farm_name FROM invitations i LEFT JOIN farms fi ON fi.id = i.farm_id
    WHERE i.user_id = u.id AND i.status = 'pending' LIMIT 1
  ) inv ON true
  WHERE u.coop_id = $1`;

const sortKeys: Record<MemberListView['sort'], string> = {
  name: 'name COLLATE natural_order',
  role: 'role',
  farm: 'shown_farm COLLATE natural_order',
  status: 'status',
  // Never signed in sorts first going up, as an empty date.
  lastSignInAt: `COALESCE(last_sign_in_at, '-infinity')`,
  joinedAt: 'created_at',
};

export function membersPageSql(q: MemberListView, coopId: string): { sql: string; bind: unknown[] } {
  const bind: unknown[] = [coopId];
  const param = (value: unknown) => {
    bind.push(value);
    return `$${bind.length}`;
  };
  const where: string[] = ['true'];
  if (q.role !== 'all') where.push(`role = ${param(q.role)}`);
  if (q.status !== 'all') where.push(`status = ${param(q.status)}`);
  if (q.q) {
    const p = param(`%${q.q.replace(/[\\%_]/g, '\\$&')}%`);
    where.push(`(name ILIKE ${p} OR email ILIKE ${p} OR farm_name ILIKE ${p})`);
  }
  const dir = q.dir === 'desc' ? 'DESC' : 'ASC';
  const sql = `SELECT id, count(*) OVER ()::int AS total FROM (${roster}) people WHERE ${where.join(' AND ')}
    ORDER BY ${sortKeys[q.sort]} ${dir}, name COLLATE natural_order ${dir}, id ${dir}
    LIMIT ${param(q.pageSize)}::bigint OFFSET ${param((q.page - 1) * q.pageSize)}::bigint`;
  return { sql, bind };
}
