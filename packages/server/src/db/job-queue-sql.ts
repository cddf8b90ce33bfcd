/*
 * The statements of a migration that adds one pg-boss queue: the owner creates it (the app role may not)
 * and grants the app role the queue tables; going down removes its jobs and the queue.
 */
const BOSS_SCHEMA = 'pgboss';

export interface QueuePolicy { retryLimit: number; retryDelay: number; expireInSeconds?: number }

export function createQueueSql(queue: string, policy: QueuePolicy, appRole: string): string {
  const options = JSON.stringify({ policy: 'standard', retryLimit: policy.retryLimit, retryDelay: policy.retryDelay, retryBackoff: true, expireInSeconds: policy.expireInSeconds });
  return `
    SELECT ${BOSS_SCHEMA}.create_queue('${queue}', '${options}'::json)
    WHERE NOT EXISTS (SELECT 1 FROM ${BOSS_SCHEMA}.queue WHERE name = '${queue}');
    GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA ${BOSS_SCHEMA} TO ${appRole};`;
}

export function dropQueueSql(queue: string): string {
  return `
    DELETE FROM ${BOSS_SCHEMA}.job WHERE name = '${queue}';
    DELETE FROM ${BOSS_SCHEMA}.archive WHERE name = '${queue}';
    SELECT ${BOSS_SCHEMA}.delete_queue('${queue}') WHERE EXISTS (SELECT 1 FROM ${BOSS_SCHEMA}.queue WHERE name = '${queue}');`;
}
