import { useForm } from 'react-hook-form';
import { skillMarkSchema, type ChoreEntryDto, type SkillMarkInput, type SkillProgressDto, type SkillState } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useMarkSkill } from '../api/mentorship-mutations';

interface Values {
  on: string;
  comment: string;
  entryIds: string[];
}

/** The mentor signs a skill off (date, comment, the entries that show it) or withdraws it with the reason. */
export function SkillMarkForm({ apprenticeId, skill, state, today, entries, onDone }: {
  apprenticeId: string; skill: SkillProgressDto; state: Exclude<SkillState, 'practising'>; today: string; entries: ChoreEntryDto[]; onDone: () => void;
}) {
  const mark = useMarkSkill(apprenticeId, skill.key);
  const form = useForm<Values, unknown, SkillMarkInput>({
    resolver: sharedSchemaResolver(skillMarkSchema, (v) => ({ state, on: v.on || undefined, comment: v.comment, entryIds: state === 'signed-off' ? v.entryIds : [] })),
    defaultValues: { on: today, comment: '', entryIds: [] },
  });
  const { submit, failure } = useServerSubmit(form, mark, { fields: ['on', 'comment', 'entryIds'], onSuccess: onDone });
  const accepted = entries.filter((e) => e.reviewState === 'accepted').slice(0, 12);
  const signing = state === 'signed-off';
  return (
    <form onSubmit={submit} noValidate className="space-y-3 rounded-xl bg-grey-50 p-3" aria-label={signing ? `Sign off ${skill.name}` : `Withdraw ${skill.name}`}>
      {signing && <p className="text-sm text-grey-700"><span className="font-semibold">Signed off means:</span> {skill.signedOffMeans}</p>}
      {signing && <TextField label="Signed off on" type="date" max={today} error={form.formState.errors.on?.message} {...form.register('on')} />}
      <TextAreaField label={signing ? 'Comment' : 'Reason for withdrawing'} rows={2} error={form.formState.errors.comment?.message} {...form.register('comment')} />
      {signing && accepted.length > 0 && (
        <fieldset className="space-y-1">
          <legend className="font-semibold text-bark">Entries that show it (optional)</legend>
          {accepted.map((e) => (
            <label key={e.id} className="flex min-h-11 items-center gap-2">
              <input type="checkbox" className="size-5 accent-moss" value={e.id} {...form.register('entryIds')} />
              <span>{e.kindLabel}, {e.doneOn}, {e.minutes} min</span>
            </label>
          ))}
        </fieldset>
      )}
      {failure && <Alert tone="error">{failure}</Alert>}
      <Button type="submit" variant={signing ? 'primary' : 'danger'} isBusy={mark.isPending}>{signing ? 'Sign off' : 'Withdraw sign-off'}</Button>
    </form>
  );
}
