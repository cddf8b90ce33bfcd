import type { ReactNode } from 'react';
import { CircleAlert, CircleCheck, Info, TriangleAlert } from 'lucide-react';
import { cn } from '../../lib/cn';

type Tone = 'info' | 'success' | 'warning' | 'error';

const tones: Record<Tone, { box: string; Icon: typeof Info }> = {
  info: { box: 'border-moss/30 bg-moss-wash text-moss-deep', Icon: Info },
  success: { box: 'border-moss/30 bg-moss-wash text-moss-deep', Icon: CircleCheck },
  warning: { box: 'border-straw bg-straw-wash text-bark', Icon: TriangleAlert },
  error: { box: 'border-clay/40 bg-clay-wash text-clay-deep', Icon: CircleAlert },
};

interface AlertProps {
  tone?: Tone;
  title?: string;
  children?: ReactNode;
  /** Buttons or links that resolve the situation. */
  actions?: ReactNode;
  className?: string;
}

/** Errors interrupt screen readers (role="alert"); everything else is announced politely. */
export function Alert({ tone = 'info', title, children, actions, className }: AlertProps) {
  const { box, Icon } = tones[tone];
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={cn('flex gap-3 rounded-xl border-2 p-4', box, className)}>
      <Icon className="mt-0.5 size-5 shrink-0" aria-hidden="true" />
      <div className="min-w-0 flex-1 space-y-2">
        {title && <p className="font-semibold">{title}</p>}
        {children && <div className="text-bark">{children}</div>}
        {actions && <div className="flex flex-wrap gap-3 pt-1">{actions}</div>}
      </div>
    </div>
  );
}
