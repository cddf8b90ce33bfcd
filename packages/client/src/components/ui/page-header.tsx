import type { ReactNode } from 'react';

interface PageHeaderProps {
  title: string;
  /** One line under the title that says what this page is for. */
  lead?: ReactNode;
  actions?: ReactNode;
}

export function PageHeader({ title, lead, actions }: PageHeaderProps) {
  return (
    <header className="flex flex-wrap items-end justify-between gap-4">
      <div className="min-w-0 space-y-1">
        <h1 className="text-3xl font-bold tracking-tight text-bark">{title}</h1>
        {lead && <p className="text-lg text-grey-600">{lead}</p>}
      </div>
      {actions && <div className="flex flex-wrap gap-3">{actions}</div>}
    </header>
  );
}
