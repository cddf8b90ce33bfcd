import { useState } from 'react';
import { TextField } from '../../../components/ui/text-field';
import { buttonClasses } from '../../../components/ui/button-styles';

/** Statement files for a period: the farm's own, or (for the admin) another farm's or the co-op's books. */
export function StatementDownloads({ farmId, coop = false, defaultFrom, defaultTo }: { farmId?: string; coop?: boolean; defaultFrom: string; defaultTo: string }) {
  const [from, setFrom] = useState(defaultFrom);
  const [to, setTo] = useState(defaultTo);
  const href = (format: 'csv' | 'pdf') => {
    const params = new URLSearchParams({ from, to, format });
    if (farmId) params.set('farmId', farmId);
    if (coop) params.set('coop', 'true');
    return `/api/ledger/statement?${params}`;
  };
  const valid = /^\d{4}-\d{2}-\d{2}$/.test(from) && /^\d{4}-\d{2}-\d{2}$/.test(to) && from <= to;
  return (
    <div className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="From" type="date" value={from} onChange={(e) => setFrom(e.target.value)} />
        <TextField label="To" type="date" value={to} onChange={(e) => setTo(e.target.value)} />
      </div>
      <div className="flex flex-wrap gap-3">
        <a className={buttonClasses('secondary', !valid ? 'pointer-events-none opacity-60' : undefined)} href={valid ? href('pdf') : undefined} download>
          Statement (PDF)
        </a>
        <a className={buttonClasses('secondary', !valid ? 'pointer-events-none opacity-60' : undefined)} href={valid ? href('csv') : undefined} download>
          Statement (CSV)
        </a>
      </div>
    </div>
  );
}
