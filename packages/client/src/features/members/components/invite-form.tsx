import { useMemo } from 'react';
import { useForm, type FieldErrors, type Resolver } from 'react-hook-form';
import { invitationSchema, type FarmDto, type InvitationInput, type MemberDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { LinkButton } from '../../../components/ui/link-button';
import { ListTextField } from '../../../components/ui/list-text-field';
import { RadioGroup } from '../../../components/ui/radio-group';
import { SelectField } from '../../../components/ui/select-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { parseBreeds } from '../../farms';
import { timeZoneOptions } from '../../farms';
import { useInviteMember } from '../api/invite-member';
import { roleDescriptions } from '../member-labels';

/** One flat form; the farm part becomes either a new farm's profile or an existing farm's id. */
interface InviteValues {
  name: string;
  email: string;
  role: 'member' | 'admin';
  farmKind: 'new' | 'existing';
  farmName: string;
  location: string;
  timeZone: string;
  breedsKept: string[];
  farmId: string;
}

function toInput(v: InviteValues): InvitationInput {
  return {
    name: v.name,
    email: v.email,
    role: v.role,
    farm:
      v.farmKind === 'existing'
        ? { kind: 'existing', farmId: v.farmId }
        : { kind: 'new', name: v.farmName, location: v.location, timeZone: v.timeZone, breedsKept: v.breedsKept },
  } as InvitationInput;
}

/** The schema's paths (farm.name, farm.farmId…) to the form's fields. */
function fieldOf(path: string): keyof InviteValues | null {
  const map: Record<string, keyof InviteValues> = {
    name: 'name',
    email: 'email',
    role: 'role',
    farm: 'farmKind',
    'farm.kind': 'farmKind',
    'farm.name': 'farmName',
    'farm.location': 'location',
    'farm.timeZone': 'timeZone',
    'farm.breedsKept': 'breedsKept',
    'farm.farmId': 'farmId',
  };
  return map[path] ?? (path.startsWith('farm.breedsKept.') ? 'breedsKept' : null);
}

const resolver: Resolver<InviteValues> = async (values) => {
  const result = invitationSchema.safeParse(toInput(values));
  if (result.success) return { values, errors: {} };
  const errors: FieldErrors<InviteValues> = {};
  for (const issue of result.error.issues) {
    const field = fieldOf(issue.path.join('.'));
    if (field && !errors[field]) errors[field] = { type: issue.code, message: issue.message };
  }
  return { values: {}, errors };
};

interface InviteFormProps {
  farms: FarmDto[];
  onInvited: (member: MemberDto) => void;
}

/** The admin invites someone directly: the same set-password e-mail an approved applicant gets. */
export function InviteForm({ farms, onInvited }: InviteFormProps) {
  const invite = useInviteMember();
  const zones = useMemo(() => timeZoneOptions('America/Chicago'), []);
  const form = useForm<InviteValues>({
    resolver,
    defaultValues: { name: '', email: '', role: 'member', farmKind: 'new', farmName: '', location: '', timeZone: 'America/Chicago', breedsKept: [], farmId: farms[0]?.id ?? '' },
  });
  const { errors } = form.formState;
  const kind = form.watch('farmKind');
  const role = form.watch('role');

  const submit = form.handleSubmit((values) => {
    invite.mutate(toInput(values), {
      onSuccess: onInvited,
      onError: (error) => {
        if (!isApiError(error)) return;
        let matched = 0;
        for (const [path, messages] of Object.entries(error.details)) {
          const field = fieldOf(path);
          if (field && messages[0]) form.setError(field, { type: 'server', message: messages[0] }, { shouldFocus: matched++ === 0 });
        }
        if (matched > 0) invite.reset();
      },
    });
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-6">
      {invite.isError && <Alert tone="error" title="Invitation not sent">{invite.error.message}</Alert>}
      <div className="grid gap-5 md:grid-cols-2">
        <TextField label="Name" autoComplete="off" error={errors.name?.message} {...form.register('name')} />
        <TextField label="E-mail" type="email" inputMode="email" autoCapitalize="none" spellCheck={false} error={errors.email?.message} {...form.register('email')} />
        <SelectField
          label="Role"
          hint={roleDescriptions[role]}
          options={[
            { value: 'member', label: 'Member' },
            { value: 'admin', label: 'Admin' },
          ]}
          error={errors.role?.message}
          {...form.register('role')}
        />
      </div>
      <RadioGroup
        legend="Their farm"
        options={[
          { value: 'new', label: 'A new farm', hint: 'Added to the directory when they set their password.' },
          { value: 'existing', label: 'A farm already in the co-op', hint: 'For a partner or family member on that farm.' },
        ]}
        error={errors.farmKind?.message}
        {...form.register('farmKind')}
      />
      {kind === 'new' ? (
        <div className="grid gap-5 md:grid-cols-2">
          <TextField label="Farm name" error={errors.farmName?.message} {...form.register('farmName')} />
          <TextField label="Location" error={errors.location?.message} {...form.register('location')} />
          <SelectField label="Time zone" options={zones} error={errors.timeZone?.message} {...form.register('timeZone')} />
          <ListTextField
            control={form.control}
            name="breedsKept"
            label="Breeds kept (optional)"
            hint="Separate breeds with commas."
            parse={parseBreeds}
            itemError="Keep each breed name under 60 characters"
          />
        </div>
      ) : (
        <SelectField
          label="Farm"
          options={farms.map((farm) => ({ value: farm.id, label: farm.name }))}
          error={errors.farmId?.message}
          {...form.register('farmId')}
        />
      )}
      <p className="text-grey-600">
        They get an e-mail with a link to set their password; it works once and expires after a few days. You can send a
        new one from their member page.
      </p>
      <div className="flex flex-col-reverse gap-3 sm:flex-row sm:justify-end">
        <LinkButton to="/admin/members" variant="secondary">
          Cancel
        </LinkButton>
        <Button type="submit" isBusy={invite.isPending}>
          Send invitation
        </Button>
      </div>
    </form>
  );
}
