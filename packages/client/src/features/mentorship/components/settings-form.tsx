import { useFieldArray, useForm } from 'react-hook-form';
import { Plus, Trash2 } from 'lucide-react';
import { mentorshipSettingsSchema, type MentorshipSettingsDto, type MentorshipSettingsInput, type SkillDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckboxField } from '../../../components/ui/checkbox-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useSaveMentorshipSettings } from '../api/mentorship-mutations';

interface Values {
  choreKinds: { key: string; label: string }[];
  skills: SkillDto[];
  requireDangerousSignOff: boolean;
}

/** A new item's key from its name; an existing item keeps its own, so its history stays with it. */
const keyOf = (name: string) => name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60);

/** The admin edits the chore kinds, the skills checklist (what "signed off" means) and the roster rule. */
export function MentorshipSettingsForm({ current }: { current: MentorshipSettingsDto }) {
  const save = useSaveMentorshipSettings();
  const form = useForm<Values, unknown, MentorshipSettingsInput>({
    resolver: sharedSchemaResolver<Values, MentorshipSettingsInput>(mentorshipSettingsSchema, (v) => ({
      choreKinds: v.choreKinds.map((k) => ({ key: k.key || keyOf(k.label), label: k.label })),
      skills: v.skills.map((s) => ({ ...s, key: s.key || keyOf(s.name) })),
      requireDangerousSignOff: v.requireDangerousSignOff,
      version: current.version,
    })),
    defaultValues: { choreKinds: current.choreKinds, skills: current.skills, requireDangerousSignOff: current.requireDangerousSignOff },
  });
  const kinds = useFieldArray({ control: form.control, name: 'choreKinds' });
  const skills = useFieldArray({ control: form.control, name: 'skills' });
  const { submit, failure } = useServerSubmit(form, save, { fields: ['choreKinds', 'skills', 'requireDangerousSignOff'] });
  const errors = form.formState.errors;
  return (
    <form onSubmit={submit} noValidate className="space-y-8" aria-label="Mentorship settings">
      <CheckboxField
        label="An apprentice needs her mentor's sign-off before she takes a dangerous station on a processing day"
        hint="Dispatch and processing stations. Local rules and licensed practice govern them in any case."
        {...form.register('requireDangerousSignOff')}
      />
      <fieldset className="space-y-3">
        <legend className="text-lg font-bold text-bark">Chores apprentices log</legend>
        {errors.choreKinds?.message && <p className="font-semibold text-clay-deep" role="alert">{errors.choreKinds.message}</p>}
        <ul className="grid gap-2 sm:grid-cols-2">
          {kinds.fields.map((field, i) => (
            <li key={field.id} className="flex items-end gap-2">
              <TextField label={`Chore ${i + 1}`} className="flex-1" error={errors.choreKinds?.[i]?.label?.message} {...form.register(`choreKinds.${i}.label`)} />
              <Button variant="quiet" aria-label={`Remove chore ${i + 1}`} onClick={() => kinds.remove(i)}><Trash2 className="size-5" aria-hidden="true" /></Button>
            </li>
          ))}
        </ul>
        <Button variant="secondary" onClick={() => kinds.append({ key: '', label: '' })}><Plus className="size-5" aria-hidden="true" /> Add a chore</Button>
      </fieldset>
      <fieldset className="space-y-3">
        <legend className="text-lg font-bold text-bark">Skills checklist</legend>
        {errors.skills?.message && <p className="font-semibold text-clay-deep" role="alert">{errors.skills.message}</p>}
        <ul className="grid gap-3 lg:grid-cols-2">
          {skills.fields.map((field, i) => (
            <li key={field.id} className="space-y-2 rounded-xl border border-grey-200 p-4">
              <div className="grid gap-2 sm:grid-cols-2">
                <TextField label="Skill" error={errors.skills?.[i]?.name?.message} {...form.register(`skills.${i}.name`)} />
                <TextField label="Area" error={errors.skills?.[i]?.area?.message} {...form.register(`skills.${i}.area`)} />
              </div>
              <TextAreaField label="Signed off means" rows={2} error={errors.skills?.[i]?.signedOffMeans?.message} {...form.register(`skills.${i}.signedOffMeans`)} />
              <div className="flex flex-wrap items-center justify-between gap-2">
                <CheckboxField label="Dangerous (shows the cautions)" {...form.register(`skills.${i}.dangerous`)} />
                <Button variant="quiet" onClick={() => skills.remove(i)}>Remove</Button>
              </div>
            </li>
          ))}
        </ul>
        <Button variant="secondary" onClick={() => skills.append({ key: '', name: '', area: '', signedOffMeans: '', dangerous: false })}>
          <Plus className="size-5" aria-hidden="true" /> Add a skill
        </Button>
      </fieldset>
      {save.isSuccess && <Alert tone="success">Saved.</Alert>}
      {failure && <Alert tone="error">{failure}</Alert>}
      <Button type="submit" isBusy={save.isPending}>Save settings</Button>
    </form>
  );
}
