import { ClipboardCheck, GraduationCap, ListChecks, NotebookPen, Settings, Users } from 'lucide-react';
import { Outlet } from 'react-router-dom';
import { CountBadge } from '../../components/ui/badge';
import { SectionTab as Tab, SectionTabs } from '../../components/ui/section-tabs';
import { useMentorshipHome } from '../../features/mentorship/api/mentorship-queries';
import { useSession } from '../../lib/session';

/** The Mentorship area: the apprentice's log and skills, or the mentor's queue and apprentices. */
export function MentorshipLayout() {
  const { user } = useSession();
  const home = useMentorshipHome();
  const apprentice = user.role === 'apprentice';
  return (
    <div className="space-y-6">
      <SectionTabs label="Mentorship">
        {apprentice ? (
          <>
            <Tab to="/mentorship" end icon={<NotebookPen className="size-5" aria-hidden="true" />}>Log a chore</Tab>
            <Tab to="/mentorship/log" icon={<ListChecks className="size-5" aria-hidden="true" />} badge={<CountBadge count={home.data?.returned ?? 0} label="returned" />}>
              My log
            </Tab>
            <Tab to="/mentorship/skills" icon={<GraduationCap className="size-5" aria-hidden="true" />}>My skills</Tab>
          </>
        ) : (
          <>
            <Tab to="/mentorship/review" icon={<ClipboardCheck className="size-5" aria-hidden="true" />} badge={<CountBadge count={home.data?.waiting ?? 0} label="waiting" />}>
              Review
            </Tab>
            <Tab to="/mentorship/apprentices" icon={<Users className="size-5" aria-hidden="true" />}>Apprentices</Tab>
            {user.role === 'admin' && <Tab to="/mentorship/settings" icon={<Settings className="size-5" aria-hidden="true" />}>Settings</Tab>}
          </>
        )}
      </SectionTabs>
      <Outlet />
    </div>
  );
}
