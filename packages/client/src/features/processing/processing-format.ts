import type { UsdaClass } from '@burrowline/shared';

/** USDA FSIS, "Rabbit from Farm to Table": the two classes, and what falls between them. */
export const usdaClassLabels: Record<UsdaClass, string> = {
  fryer: 'Fryer / young rabbit',
  roaster: 'Roaster / mature rabbit',
  unclassed: 'Unclassed',
};

export const usdaClassTone: Record<UsdaClass, 'moss' | 'straw' | 'neutral'> = { fryer: 'moss', roaster: 'straw', unclassed: 'neutral' };

export const percent = (v: number | null) => (v === null ? '—' : `${v.toFixed(1)} %`);

export function ageText(days: number | null): string {
  if (days === null) return 'age unknown';
  return days < 120 ? `${days} d (${(days / 7).toFixed(1)} wk)` : `${days} d (${(days / 30.44).toFixed(1)} mo)`;
}
