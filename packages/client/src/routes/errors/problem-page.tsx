import type { ReactNode } from 'react';
import { BrandMark } from '../../components/ui/brand-mark';
import { Card } from '../../components/ui/card';
import { PageTitle } from '../../components/ui/page-title';

interface ProblemPageProps {
  title: string;
  children: ReactNode;
  actions: ReactNode;
  /** Outside the signed-in layout there is no top bar, so show the mark. */
  standalone?: boolean;
}

export function ProblemPage({ title, children, actions, standalone = false }: ProblemPageProps) {
  const body = (
    <Card className="mx-auto max-w-xl space-y-4">
      <PageTitle>{title}</PageTitle>
      <h1 className="text-2xl font-bold tracking-tight">{title}</h1>
      <div className="space-y-2 text-grey-700">{children}</div>
      <div className="flex flex-wrap gap-3 pt-2">{actions}</div>
    </Card>
  );
  if (!standalone) return body;
  return (
    <main className="flex min-h-dvh flex-col items-center gap-6 px-4 py-10 sm:justify-center">
      <span className="text-moss-deep">
        <BrandMark />
      </span>
      <div className="w-full">{body}</div>
    </main>
  );
}
