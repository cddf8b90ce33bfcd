import type { ReactNode } from 'react';
import { BrandMark } from '../../../components/ui/brand-mark';
import { Card } from '../../../components/ui/card';
import { PageTitle } from '../../../components/ui/page-title';

interface AuthLayoutProps {
  title: string;
  lead?: ReactNode;
  children: ReactNode;
  footer?: ReactNode;
}

/** The frame of the signed-out screens: one narrow card, easy to use one-handed. */
export function AuthLayout({ title, lead, children, footer }: AuthLayoutProps) {
  return (
    <main className="flex min-h-dvh flex-col items-center px-4 py-10 sm:justify-center">
      <PageTitle>{title}</PageTitle>
      <div className="w-full max-w-md space-y-6">
        <div className="flex justify-center text-moss-deep">
          <BrandMark />
        </div>
        <Card className="space-y-6">
          <div className="space-y-2">
            <h1 className="text-2xl font-bold tracking-tight">{title}</h1>
            {lead && <p className="text-grey-600">{lead}</p>}
          </div>
          {children}
        </Card>
        {footer && <div className="text-center">{footer}</div>}
      </div>
    </main>
  );
}
