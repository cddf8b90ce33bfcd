import { countOf } from '@burrowline/shared';
import { GraduationCap } from 'lucide-react';
import { Card } from '../../../components/ui/card';
import { LinkButton } from '../../../components/ui/link-button';
import { useMentorshipHome } from '../api/mentorship-queries';

/** The Co-op hub's card: the next thing to do in Mentorship for the signed-in person. */
export function MentorshipSummary() {
  const home = useMentorshipHome();
  if (!home.data) return null;
  const h = home.data;
  const [line, action, to] =
    h.role === 'apprentice'
      ? [h.returned > 0 ? `${h.returned} returned to correct · ${h.waiting} waiting` : `${h.waiting} waiting for your mentor`, h.returned > 0 ? 'Correct returned' : 'Log a chore', h.returned > 0 ? '/mentorship/log?state=returned' : '/mentorship']
      : h.role === 'mentor'
        ? [`${h.waiting} waiting for your review · ${countOf(h.apprentices.filter((a) => a.mentor).length, 'apprentice')}`, 'Review', '/mentorship/review']
        : h.role === 'admin'
          ? [`${countOf(h.apprentices.length, 'apprentice')} in the co-op`, 'Apprentices', '/mentorship/apprentices']
          : ['Apprentices learn the trade on a mentor\'s farm.', 'Mentorship', '/mentorship/apprentices'];
  return (
    <Card className="space-y-3">
      <h2 className="flex items-center gap-2 text-xl font-bold text-bark"><GraduationCap className="size-6 text-moss" aria-hidden="true" /> Mentorship</h2>
      <p className="text-grey-700">{line}</p>
      <LinkButton to={to} variant="primary">{action}</LinkButton>
    </Card>
  );
}
