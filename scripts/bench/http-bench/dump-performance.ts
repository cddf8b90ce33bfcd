// Prints the performance tables of the given members' farms as JSON, to compare two versions of the
// code on the same data. DUMP_ACTORS: a JSON list of session users (id, coopId, farmId, email, name, role).
export {};

const { connectDatabase, closeDatabase } = await import('../../../packages/server/src/composition/database');
const { farmPerformance } = await import('../../../packages/server/src/modules/performance/performance.service');
connectDatabase(process.env.DATABASE_URL!);
const out: Record<string, unknown> = {};
for (const actor of JSON.parse(process.env.DUMP_ACTORS ?? '[]') as Parameters<typeof farmPerformance>[0][]) {
  for (const period of ['all', 'last_12_months'] as const) out[`${actor.email}:${period}`] = await farmPerformance(actor, { period } as never);
}
console.log(JSON.stringify(out));
await closeDatabase();
