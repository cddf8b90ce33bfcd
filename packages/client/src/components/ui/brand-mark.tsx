import { cn } from '../../lib/cn';

const palettes = {
  // On oat: the favicon's colours.
  light: { tile: '#2F5D50', ground: '#E9C46A', mound: '#F7F3EA', burrow: '#3B2F2A' },
  // On the moss top bar a moss tile would vanish, so the tile turns straw.
  onMoss: { tile: '#E9C46A', ground: '#3B2F2A', mound: '#F7F3EA', burrow: '#3B2F2A' },
};

/** Our mark: a burrow mouth on a ground line (the same drawing as the favicon). */
export function BrandMark({ className, withName = true, onMoss = false }: { className?: string; withName?: boolean; onMoss?: boolean }) {
  const colours = onMoss ? palettes.onMoss : palettes.light;
  return (
    <span className={cn('inline-flex items-center gap-2.5 font-bold tracking-tight', className)}>
      <svg viewBox="0 0 64 64" className="size-9 shrink-0" aria-hidden="true">
        <rect width="64" height="64" rx="14" fill={colours.tile} />
        <path d="M12 46h40" stroke={colours.ground} strokeWidth="5" strokeLinecap="round" />
        <path d="M20 46a12 12 0 0 1 24 0" fill={colours.mound} />
        <path d="M25 46a7 7 0 0 1 14 0" fill={colours.burrow} />
      </svg>
      {withName && <span className="text-xl">Burrowline</span>}
    </span>
  );
}
