import type { AgeClass, CustodyEventKind, CustodyStatus, Disposition, Lifecycle, Purity, Sex } from '@burrowline/shared';
import type { BadgeTone } from '../../components/ui/badge';

export const sexLabels: Record<Sex, string> = { buck: 'Buck', doe: 'Doe' };
export const lifecycleLabels: Record<Lifecycle, string> = { kit: 'Kit', junior: 'Junior', breeding: 'Breeding', retired: 'Retired' };
export const dispositionLabels: Record<Disposition, string> = {
  on_farm: 'On the farm', sold: 'Sold', transferred: 'Transferred', processed: 'Processed', died: 'Died', culled: 'Culled',
};
export const custodyLabels: Record<CustodyStatus, string> = { at_home: 'At home', lent_out: 'Lent out', on_loan_here: 'On loan here' };
export const custodyEventLabels: Record<CustodyEventKind, string> = {
  born: 'Born', arrived: 'Arrived', transferred: 'Transferred', lent: 'Lent', returned: 'Returned home', left: 'Left the co-op',
};
export const ageClassLabels: Record<AgeClass, string> = { junior: 'Junior', intermediate: 'Intermediate', senior: 'Senior' };

export const purityLabels: Record<Purity, string> = {
  purebred: 'Purebred', known_cross: 'Known cross', partly_unknown: 'Partly unknown', unknown: 'Unknown ancestry',
};
export const purityTones: Record<Purity, BadgeTone> = { purebred: 'moss', known_cross: 'straw', partly_unknown: 'clay', unknown: 'clay' };

const vulgar: Record<string, string> = { '1/2': '½', '1/4': '¼', '3/4': '¾', '1/8': '⅛', '3/8': '⅜', '5/8': '⅝', '7/8': '⅞' };

/** A make-up share as the trade says it: ½, ¼, ⅜, 3/16 … (dyadic fractions), or a percentage past 1/64. */
export function formatShare(fraction: number): string {
  if (fraction >= 1) return 'all';
  for (let denominator = 2; denominator <= 64; denominator *= 2) {
    const numerator = fraction * denominator;
    if (Math.abs(numerator - Math.round(numerator)) < 1e-9) {
      const key = `${Math.round(numerator)}/${denominator}`;
      return vulgar[key] ?? key;
    }
  }
  return `${(fraction * 100).toFixed(1)} %`;
}

/** COI as a percentage with the precision breeders read it at: 0 %, 6.25 %, 12.5 %, 25 %. */
export function formatCoi(coi: number): string {
  if (coi === 0) return '0 %';
  const percent = coi * 100;
  const text = percent.toFixed(2).replace(/\.?0+$/, '');
  return `${text} %`;
}

/**
 * A plain-words reading of a COI against the textbook matings (Falconer & Mackay): below a
 * first-cousin mating (6.25 %), up to a half-sib mating (12.5 %), or as close as full sibs and beyond.
 */
export function coiLevel(coi: number): { label: string; tone: BadgeTone } {
  if (coi === 0) return { label: 'No shared ancestors on record', tone: 'moss' };
  if (coi < 0.0625) return { label: 'Below first cousins', tone: 'moss' };
  if (coi < 0.125) return { label: 'Up to half sibs', tone: 'straw' };
  if (coi < 0.25) return { label: 'Half sibs or closer', tone: 'clay' };
  return { label: 'Full sibs or closer', tone: 'clay' };
}
