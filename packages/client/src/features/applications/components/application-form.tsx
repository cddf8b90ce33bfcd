import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo, useState, type ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import { applicationSchema, ErrorCode, sharingOptions, type ApplicationInput, type ApplicationReceiptDto, type PublicCoopDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckboxField } from '../../../components/ui/checkbox-field';
import { ListTextField } from '../../../components/ui/list-text-field';
import { RadioGroup } from '../../../components/ui/radio-group';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { newIdempotencyKey } from '../../../lib/idempotency';
import { parseBreeds } from '../../farms';
import { timeZoneOptions } from '../../farms';
import { useSubmitApplication } from '../api/submit-application';
import { sharingLabels } from '../application-labels';

const fieldNames = [
  'applicantName', 'email', 'phone', 'farmName', 'location', 'timeZone', 'breedsKept', 'does', 'bucks',
  'quarantinePractice', 'diseaseLastYear', 'diseaseDetails', 'sharing', 'sharingNotes', 'agreeToRules',
] as const;

function browserTimeZone(): string {
  try {
    return Intl.DateTimeFormat().resolvedOptions().timeZone || 'America/Chicago';
  } catch {
    return 'America/Chicago';
  }
}

function Section({ title, lead, children }: { title: string; lead?: string; children: ReactNode }) {
  return (
    <fieldset className="space-y-5 border-t border-grey-200 pt-6 first:border-t-0 first:pt-0">
      <legend className="float-left mb-1 w-full text-xl font-bold">{title}</legend>
      {lead && <p className="clear-both text-grey-600">{lead}</p>}
      <div className="clear-both space-y-5">{children}</div>
    </fieldset>
  );
}

function failureText(error: unknown): string {
  if (isApiError(error, ErrorCode.rateLimited)) return error.message;
  if (isApiError(error, 'network_error')) return "Can't reach Burrowline right now. Your answers are still here; send again when you are back online.";
  return error instanceof Error ? error.message : 'The application was not sent. Try again.';
}

interface ApplicationFormProps {
  coop: PublicCoopDto;
  onSent: (receipt: ApplicationReceiptDto) => void;
}

/** The public application form. Its idempotency key lives as long as the form, so a retry never applies twice. */
export function ApplicationForm({ coop, onSent }: ApplicationFormProps) {
  const submit = useSubmitApplication(coop.slug);
  const [idempotencyKey] = useState(newIdempotencyKey);
  const defaultZone = useMemo(browserTimeZone, []);
  const zones = useMemo(() => timeZoneOptions(defaultZone), [defaultZone]);
  const form = useForm<ApplicationInput>({
    resolver: zodResolver(applicationSchema),
    defaultValues: {
      idempotencyKey,
      applicantName: '',
      email: '',
      phone: '',
      farmName: '',
      location: '',
      timeZone: defaultZone,
      breedsKept: [],
      quarantinePractice: '',
      diseaseDetails: '',
      sharing: [],
      sharingNotes: '',
    },
  });
  const { errors } = form.formState;
  const diseased = form.watch('diseaseLastYear') === 'yes';

  const onSubmit = form.handleSubmit((values) => {
    submit.mutate(
      { ...values, idempotencyKey },
      {
        onSuccess: onSent,
        onError: (error) => {
          if (applyServerFieldErrors(error, form.setError, fieldNames)) submit.reset();
        },
      },
    );
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-8">
      {submit.isError && (
        <Alert tone="error" title="Application not sent">
          {failureText(submit.error)}
        </Alert>
      )}

      <Section title="About you">
        <div className="grid gap-5 md:grid-cols-2">
          <TextField label="Your name" autoComplete="name" error={errors.applicantName?.message} {...form.register('applicantName')} />
          <TextField
            label="E-mail"
            type="email"
            autoComplete="email"
            inputMode="email"
            autoCapitalize="none"
            spellCheck={false}
            hint="The coordinator's answer and, if you are admitted, your sign-in link go here."
            error={errors.email?.message}
            {...form.register('email')}
          />
          <TextField label="Phone (optional)" type="tel" autoComplete="tel" error={errors.phone?.message} {...form.register('phone')} />
        </div>
      </Section>

      <Section title="Your farm">
        <div className="grid gap-5 md:grid-cols-2">
          <TextField label="Farm name" autoComplete="organization" error={errors.farmName?.message} {...form.register('farmName')} />
          <TextField
            label="Location"
            hint="Town or area, as you want other members to see it."
            error={errors.location?.message}
            {...form.register('location')}
          />
          <SelectField
            label="Time zone"
            hint="Due dates and reminders follow the farm's own clock."
            options={zones}
            error={errors.timeZone?.message}
            {...form.register('timeZone')}
          />
          <ListTextField
            control={form.control}
            name="breedsKept"
            label="Breeds kept"
            hint="Separate breeds with commas, for example: New Zealand, Californian. Leave empty if you are just starting."
            parse={parseBreeds}
            itemError="Keep each breed name under 60 characters"
          />
        </div>
      </Section>

      <Section title="Your herd and how you keep it healthy" lead="New members bring animals, and with them disease risk; the coordinator reads these answers closely.">
        <div className="grid grid-cols-2 gap-5 md:max-w-md">
          <TextField label="Breeding does" type="number" inputMode="numeric" min={0} error={errors.does?.message} {...form.register('does', { valueAsNumber: true })} />
          <TextField label="Breeding bucks" type="number" inputMode="numeric" min={0} error={errors.bucks?.message} {...form.register('bucks', { valueAsNumber: true })} />
        </div>
        <TextAreaField
          label="How do you quarantine new stock?"
          hint="Where new or returning animals stay, for how long, and what you do to keep them apart (separate shed, gloves, feeders)."
          error={errors.quarantinePractice?.message}
          {...form.register('quarantinePractice')}
        />
        <Alert tone="warning" title="Biosecurity">
          Isolate new or returning rabbits before they meet your herd or anyone else's; 30 days is a common
          recommendation for RHDV2 (rabbit hemorrhagic disease). Ask your veterinarian about anything you are unsure of.
        </Alert>
        <RadioGroup
          legend="Has your herd had disease in the last year?"
          hint="For example snuffles, ear mites, coccidiosis, sudden deaths. An honest yes does not rule you out."
          inline
          options={[
            { value: 'no', label: 'No' },
            { value: 'yes', label: 'Yes' },
          ]}
          error={errors.diseaseLastYear?.message}
          {...form.register('diseaseLastYear')}
        />
        {diseased && (
          <TextAreaField
            label="What was it, and how was it dealt with?"
            error={errors.diseaseDetails?.message}
            {...form.register('diseaseDetails')}
          />
        )}
      </Section>

      <Section title="Working together" lead="What you hope to share with the other farms.">
        <div>
          {sharingOptions.map((option) => (
            <CheckboxField key={option} label={sharingLabels[option]} value={option} {...form.register('sharing')} />
          ))}
        </div>
        <TextAreaField label="Anything to add (optional)" rows={3} error={errors.sharingNotes?.message} {...form.register('sharingNotes')} />
      </Section>

      <Section title={`The rules of ${coop.name}`}>
        {coop.rulesText ? (
          <div
            role="region"
            aria-label={`Rules of ${coop.name}`}
            tabIndex={0}
            className="max-h-72 overflow-y-auto rounded-xl border-2 border-grey-200 bg-oat/60 p-4 whitespace-pre-line"
          >
            {coop.rulesText}
          </div>
        ) : (
          <p className="text-grey-600">The co-op has not written its rules here yet; the coordinator will go through them with you.</p>
        )}
        <CheckboxField
          label={`I have read the rules of ${coop.name} and will keep them.`}
          error={errors.agreeToRules?.message}
          {...form.register('agreeToRules')}
        />
      </Section>

      <div className="flex justify-end">
        <Button type="submit" className="w-full sm:w-auto" isBusy={submit.isPending}>
          Send application
        </Button>
      </div>
    </form>
  );
}
