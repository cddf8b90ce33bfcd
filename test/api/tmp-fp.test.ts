import { it } from 'vitest';
import { ownerDb } from '../support/db';
it('times', async () => {
  await ownerDb(async (c) => {
    const tables = (await c.query(`SELECT table_name FROM information_schema.columns WHERE table_schema = 'public' AND column_name = 'coop_id'`)).rows.map((r: any) => r.table_name);
    await c.query('BEGIN'); await c.query('SET LOCAL jit = off'); await c.query(`SELECT set_config('app.coop_id', '00000000-0000-4000-8000-000000000001', true)`);
    for (const mode of ['auto', 'force_generic_plan', 'force_custom_plan']) {
      await c.query(`SET LOCAL plan_cache_mode = ${mode}`);
      const out: string[] = [];
      let total = 0;
      for (const t of tables) {
        const q = { name: `${mode}-${t}`, text: `SELECT count(*)::text || ':' || coalesce(sum(xmin::text::bigint), 0)::text FROM "${t}" WHERE coop_id = $1`, values: ['00000000-0000-4000-8000-000000000001'] };
        for (let i = 0; i < 6; i++) await c.query(q);
        const s = performance.now(); for (let i = 0; i < 20; i++) await c.query(q); const ms = (performance.now() - s) / 20;
        total += ms; if (ms > 0.3) out.push(`${t} ${ms.toFixed(2)}`);
      }
      console.log(mode, total.toFixed(1), out.join(', '));
    }
    await c.query('ROLLBACK');
  });
});
