import { useState } from 'react';
import { Download, TriangleAlert } from 'lucide-react';
import { dangerousSkillCaution, type SkillProgressDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { cn } from '../../../lib/cn';
import { errorText } from '../../../lib/form-errors';
import { useMarkSkill } from '../api/mentorship-mutations';
import type { ApprenticePage } from '../api/mentorship-queries';
import { ChoreCard, hoursText } from './chore-card';
import { SkillMarkForm } from './skill-mark-form';

const stateWords = { 'signed-off': 'Signed off', practising: 'Practising', withdrawn: 'Withdrawn', 'not-started': 'Not started' } as const;
const stateTone = { 'signed-off': 'moss', practising: 'straw', withdrawn: 'clay', 'not-started': 'neutral' } as const;
const squareColour = { 'signed-off': 'bg-moss', practising: 'bg-straw', withdrawn: 'bg-clay', 'not-started': 'bg-grey-200' } as const;

/** Progress as a picture: one square per skill, by area (done, practising, not started). */
function ProgressPicture({ skills }: { skills: SkillProgressDto[] }) {
  const areas = [...new Set(skills.map((s) => s.area))];
  return (
    <div className="space-y-3">
      <ul className="grid gap-2 sm:grid-cols-2">
        {areas.map((area) => {
          const mine = skills.filter((s) => s.area === area);
          const done = mine.filter((s) => s.state === 'signed-off').length;
          return (
            <li key={area} className="flex items-center justify-between gap-3 rounded-lg bg-grey-50 px-3 py-2">
              <span className="font-semibold text-bark">{area}</span>
              <span className="flex items-center gap-1" aria-label={`${area}: ${done} of ${mine.length} signed off`}>
                {mine.map((s) => <span key={s.key} title={`${s.name}: ${stateWords[s.state]}`} className={cn('size-5 rounded', squareColour[s.state])} aria-hidden="true" />)}
              </span>
            </li>
          );
        })}
      </ul>
      <p className="flex flex-wrap gap-3 text-sm text-grey-600" aria-hidden="true">
        <span className="inline-flex items-center gap-1"><span className="size-3 rounded bg-moss" /> Signed off</span>
        <span className="inline-flex items-center gap-1"><span className="size-3 rounded bg-straw" /> Practising</span>
        <span className="inline-flex items-center gap-1"><span className="size-3 rounded bg-grey-200" /> Not started</span>
      </p>
    </div>
  );
}

function SkillRow({ page, skill, today }: { page: ApprenticePage; skill: SkillProgressDto; today: string }) {
  const [open, setOpen] = useState<null | 'signed-off' | 'withdrawn'>(null);
  const practise = useMarkSkill(page.id, skill.key);
  return (
    <li className="space-y-2 rounded-xl border border-grey-200 p-4">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <h3 className="font-bold text-bark">{skill.name}</h3>
          <p className="text-sm text-grey-600">{skill.area}</p>
        </div>
        <Badge tone={stateTone[skill.state]}>{stateWords[skill.state]}{skill.on ? ` · ${skill.on}` : ''}</Badge>
      </div>
      {skill.dangerous && (
        <p className="flex gap-2 text-sm text-clay-deep"><TriangleAlert className="size-5 shrink-0" aria-hidden="true" />{dangerousSkillCaution}</p>
      )}
      {skill.state !== 'not-started' && skill.comment && <p className="text-grey-700">{skill.by?.name}: {skill.comment}</p>}
      {page.canReview && (
        <div className="flex flex-wrap gap-2">
          {skill.state !== 'practising' && skill.state !== 'signed-off' && (
            <Button variant="secondary" isBusy={practise.isPending} onClick={() => practise.mutate({ state: 'practising', comment: '', entryIds: [] })}>Practising</Button>
          )}
          {skill.state !== 'signed-off' && <Button onClick={() => setOpen(open === 'signed-off' ? null : 'signed-off')} aria-expanded={open === 'signed-off'}>Sign off…</Button>}
          {skill.state === 'signed-off' && <Button variant="secondary" onClick={() => setOpen(open === 'withdrawn' ? null : 'withdrawn')} aria-expanded={open === 'withdrawn'}>Withdraw…</Button>}
        </div>
      )}
      {practise.error ? <Alert tone="error">{errorText(practise.error)}</Alert> : null}
      {open && <SkillMarkForm apprenticeId={page.id} skill={skill} state={open} today={today} entries={page.entries} onDone={() => setOpen(null)} />}
    </li>
  );
}

/** An apprentice's page: progress, hours by kind and week, skills (the mentor marks them), recent entries. */
export function ApprenticeView({ page, today, showEntries = true }: { page: ApprenticePage; today: string; showEntries?: boolean }) {
  const maxWeek = Math.max(1, ...page.weeks.map((w) => w.minutes));
  const maxKind = Math.max(1, ...page.minutesByKind.map((k) => k.minutes));
  return (
    <div className="space-y-6">
      <Card className="space-y-4">
        <div className="flex flex-wrap items-center justify-between gap-3">
          <h2 className="text-xl font-bold text-bark">Progress</h2>
          <a className="inline-flex min-h-11 items-center gap-2 rounded-lg border-2 border-moss px-4 font-semibold text-moss-deep hover:bg-moss-wash" href={`/api/mentorship/apprentices/${page.id}/record-of-skills`}>
            <Download className="size-5" aria-hidden="true" /> Record of skills (PDF)
          </a>
        </div>
        <p className="text-grey-700">{page.signedOff} of {page.skillCount} skills signed off{page.mentor ? ` · mentor ${page.mentor.name}` : ''}</p>
        <ProgressPicture skills={page.skills} />
      </Card>
      <Card className="space-y-4">
        <h2 className="text-xl font-bold text-bark">Hours (accepted work)</h2>
        {page.minutesByKind.length === 0 ? <p className="text-grey-600">No accepted entries yet.</p> : (
          <div className="grid gap-6 lg:grid-cols-2">
            <ul className="space-y-2" aria-label="By kind">
              {page.minutesByKind.map((k) => (
                <li key={k.kind} className="grid grid-cols-[7rem_1fr_3.5rem] items-center gap-2 text-sm">
                  <span className="truncate font-semibold text-bark">{k.label}</span>
                  <span className="h-3 rounded-full bg-grey-100"><span className="block h-3 rounded-full bg-moss" style={{ width: `${(k.minutes / maxKind) * 100}%` }} /></span>
                  <span className="text-right tabular-nums">{hoursText(k.minutes)}</span>
                </li>
              ))}
            </ul>
            <ul className="flex h-32 items-end gap-1" aria-label="By week">
              {page.weeks.map((w) => (
                <li key={w.weekOf} className="flex flex-1 flex-col items-center justify-end gap-1" title={`Week of ${w.weekOf}: ${hoursText(w.minutes)}`}>
                  <span className="w-full rounded-t bg-straw" style={{ height: `${(w.minutes / maxWeek) * 100}px` }} />
                  <span className="text-xs text-grey-600">{w.weekOf.slice(5)}</span>
                </li>
              ))}
            </ul>
          </div>
        )}
      </Card>
      <section className="space-y-3" aria-labelledby="skills-heading">
        <h2 id="skills-heading" className="text-xl font-bold text-bark">Skills</h2>
        <Alert tone="warning" title="Dangerous work">Dispatch and processing stations are learned under supervision. Local rules and licensed practice govern them.</Alert>
        <ul className="grid gap-3 lg:grid-cols-2">
          {page.skills.map((s) => <SkillRow key={s.key} page={page} skill={s} today={today} />)}
        </ul>
      </section>
      {showEntries && (
        <section className="space-y-3" aria-labelledby="entries-heading">
          <h2 id="entries-heading" className="text-xl font-bold text-bark">Recent entries</h2>
          {page.entries.length === 0 ? <p className="text-grey-600">None yet.</p> : (
            <ul className="grid gap-3 lg:grid-cols-2">{page.entries.map((e) => <li key={e.id}><ChoreCard entry={e} /></li>)}</ul>
          )}
        </section>
      )}
    </div>
  );
}
