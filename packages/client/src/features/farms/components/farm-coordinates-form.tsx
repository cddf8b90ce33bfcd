import { useForm } from 'react-hook-form';
import { farmCoordinatesSchema, type FarmCoordinatesInput, type FarmDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckboxField } from '../../../components/ui/checkbox-field';
import { TextField } from '../../../components/ui/text-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useSetFarmCoordinates } from '../api/set-farm-coordinates';

interface Values {
  latitude: string;
  longitude: string;
  sharesGetRecords: boolean;
}

const degrees = (text: string) => (text.trim() === '' ? null : Number(text.trim().replace(',', '.')));

/**
 * Where the farm is, as two numbers, so Stud Share can tell members how far a buck would travel; no map
 * service is asked. Both or neither. And whether the farm's litters count in a sire's get's record.
 */
export function FarmCoordinatesForm({ farm }: { farm: FarmDto }) {
  const save = useSetFarmCoordinates(farm.id);
  const form = useForm<Values, unknown, FarmCoordinatesInput>({
    resolver: sharedSchemaResolver(farmCoordinatesSchema, (v) => ({ latitude: degrees(v.latitude), longitude: degrees(v.longitude), sharesGetRecords: v.sharesGetRecords })),
    defaultValues: { latitude: farm.latitude?.toString() ?? '', longitude: farm.longitude?.toString() ?? '', sharesGetRecords: farm.sharesGetRecords },
  });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, save, { fields: ['latitude', 'longitude', 'sharesGetRecords'] });
  return (
    <form noValidate onSubmit={submit} className="space-y-4" aria-label="Coordinates and shared records">
      <h2 className="text-xl font-bold">Coordinates and shared records</h2>
      <p className="text-grey-700">Optional. With both farms' coordinates, Stud Share shows how far a buck would travel.</p>
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Latitude" inputMode="decimal" placeholder="e.g. 38.8951" error={errors.latitude?.message} {...form.register('latitude')} />
        <TextField label="Longitude" inputMode="decimal" placeholder="e.g. -92.3341" error={errors.longitude?.message} {...form.register('longitude')} />
      </div>
      <CheckboxField
        label="Count our litters in the get's record of the sires we use"
        hint="Litter sizes, weaning, growth and dress-out, as averages on the buck's card; never your other records."
        {...form.register('sharesGetRecords')}
      />
      {save.isSuccess && <Alert tone="success">Saved.</Alert>}
      {failure && <Alert tone="error">{failure}</Alert>}
      <Button type="submit" variant="secondary" isBusy={save.isPending}>Save coordinates and sharing</Button>
    </form>
  );
}
