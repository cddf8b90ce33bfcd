import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo } from 'react';
import { useForm } from 'react-hook-form';
import { ErrorCode, farmProfileSchema, type FarmDto, type FarmProfileInput } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { LinkButton } from '../../../components/ui/link-button';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { isApiError } from '../../../lib/api-client';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { useUpdateFarm } from '../api/update-farm';
import { weightUnitLabels } from '../farm-labels';
import { timeZoneOptions } from '../time-zone-options';
import { BreedsField } from './breeds-field';

const fieldNames = ['name', 'location', 'timeZone', 'weightUnit', 'temperatureUnit', 'breedsKept', 'description'] as const;

const weightUnitOptions = [
  { value: 'lb_oz', label: weightUnitLabels.lb_oz },
  { value: 'kg_g', label: weightUnitLabels.kg_g },
] as const;

const temperatureUnitOptions = [
  { value: 'F', label: '°F (Fahrenheit)' },
  { value: 'C', label: '°C (Celsius)' },
] as const;

function toFormValues(farm: FarmDto): FarmProfileInput {
  const { name, location, timeZone, weightUnit, temperatureUnit, breedsKept, description } = farm;
  return { name, location, timeZone, weightUnit, temperatureUnit, breedsKept, description };
}

interface FarmProfileFormProps {
  /** The profile as it was when editing began; its version is what the save is checked against. */
  farm: FarmDto;
  /** The newest version we have heard of (a live update may have arrived while editing). */
  latestVersion: number;
  onReload: () => void;
  isReloading: boolean;
  onSaved: (farm: FarmDto) => void;
}

export function FarmProfileForm({ farm, latestVersion, onReload, isReloading, onSaved }: FarmProfileFormProps) {
  const update = useUpdateFarm(farm.id);
  const form = useForm({ resolver: zodResolver(farmProfileSchema), defaultValues: toFormValues(farm) });
  const { errors } = form.formState;
  const zones = useMemo(() => timeZoneOptions(farm.timeZone), [farm.timeZone]);

  const submit = form.handleSubmit((values) => {
    update.mutate(
      { ...values, version: farm.version },
      {
        onSuccess: onSaved,
        onError: (error) => {
          if (applyServerFieldErrors(error, form.setError, fieldNames)) update.reset();
        },
      },
    );
  });

  const isStale = isApiError(update.error, ErrorCode.staleVersion);
  const reloadButton = (
    <Button variant="secondary" onClick={onReload} isBusy={isReloading}>
      Reload latest profile
    </Button>
  );

  return (
    <form onSubmit={submit} noValidate className="space-y-6">
      {isStale ? (
        <Alert tone="warning" title="Someone else saved this profile first" actions={reloadButton}>
          Your changes were not saved, so nothing of theirs was overwritten. Reload to see their version, then make
          your changes again. Reloading replaces what you typed here.
        </Alert>
      ) : (
        latestVersion > farm.version && (
          <Alert tone="info" title="This profile was just changed by someone else" actions={reloadButton}>
            Saving now would be refused. Reload to see their changes first; that replaces what you typed here.
          </Alert>
        )
      )}
      {update.isError && !isStale && (
        <Alert tone="error" title="Profile not saved">
          {isApiError(update.error, ErrorCode.forbidden) ? "You can only edit your own farm's profile." : update.error.message}
        </Alert>
      )}

      <div className="grid gap-5 md:grid-cols-2">
        <TextField label="Farm name" autoComplete="organization" error={errors.name?.message} {...form.register('name')} />
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
        <SelectField label="Weight units" options={weightUnitOptions} error={errors.weightUnit?.message} {...form.register('weightUnit')} />
        <SelectField
          label="Temperature units"
          options={temperatureUnitOptions}
          error={errors.temperatureUnit?.message}
          {...form.register('temperatureUnit')}
        />
        <BreedsField control={form.control} />
        <TextAreaField
          label="About the farm"
          hint="What you raise, how you keep them, what you can offer the co-op. Up to 1,000 characters."
          className="md:col-span-2"
          error={errors.description?.message}
          {...form.register('description')}
        />
      </div>

      <div className="flex flex-col-reverse gap-3 sm:flex-row sm:justify-end">
        <LinkButton to={`/farms/${farm.id}`} variant="secondary">
          Cancel
        </LinkButton>
        <Button type="submit" isBusy={update.isPending}>
          Save profile
        </Button>
      </div>
    </form>
  );
}
