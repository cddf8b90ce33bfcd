/**
 * The row-level security every tenant table gets (see 0002): enabled, forced even for the table's
 * owner, and one policy keeping rows to the co-op set by `withTenant` for the transaction.
 */
export function tenantIsolation(table: string): string {
  return `
    ALTER TABLE ${table} ENABLE ROW LEVEL SECURITY;
    ALTER TABLE ${table} FORCE ROW LEVEL SECURITY;
    CREATE POLICY ${table}_tenant ON ${table} USING (coop_id = current_coop_id()) WITH CHECK (coop_id = current_coop_id());`;
}
