import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import {
  notificationPreferencesSchema, type NotificationDelivery, type NotificationPreferencesDto, type NotificationPreferencesInput,
} from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useSetNotificationPreferences } from '../api/notification-mutations';

/** One choice per kind, in the order the server lists them (a kind's name has a dot, which a form would read as nesting). */
interface Values {
  deliveries: NotificationDelivery[];
}

const deliveryOptions = [
  { value: 'immediately', label: 'E-mail at once' },
  { value: 'digest', label: 'In the morning e-mail' },
  { value: 'never', label: 'Bell only, no e-mail' },
] as const;

/** How the person wants to hear of each kind by e-mail; the bell always shows everything. */
export function PreferencesForm({ current }: { current: NotificationPreferencesDto }) {
  const save = useSetNotificationPreferences();
  const form = useForm<Values, unknown, NotificationPreferencesInput>({
    resolver: sharedSchemaResolver(notificationPreferencesSchema, (values) => ({
      preferences: current.preferences.map((p, index) => ({ kind: p.kind, delivery: values.deliveries[index] ?? p.delivery })),
    })),
    defaultValues: { deliveries: current.preferences.map((p) => p.delivery) },
  });
  const { submit, failure } = useServerSubmit(form, save, { fields: [] });
  const areas = [...new Set(current.preferences.map((p) => p.area))];
  return (
    <form onSubmit={submit} noValidate className="space-y-6" aria-label="E-mail preferences">
      {!current.morningEmailOn && (
        <p className="text-grey-700">
          The morning e-mail is off, so anything set to it waits in the bell. <Link className="font-semibold text-moss-deep underline" to="/almanac/settings">Turn it on in the Almanac settings</Link>.
        </p>
      )}
      {areas.map((area) => (
        <fieldset key={area} className="space-y-3">
          <legend className="text-lg font-bold text-bark">{area}</legend>
          <div className="grid gap-3 md:grid-cols-2">
            {current.preferences.map((p, index) => p.area === area && (
              <SelectField key={p.kind} label={p.label} options={deliveryOptions} {...form.register(`deliveries.${index}`)} />
            ))}
          </div>
        </fieldset>
      ))}
      {save.isSuccess && <Alert tone="success">Saved.</Alert>}
      {failure && <Alert tone="error">{failure}</Alert>}
      <Button type="submit" isBusy={save.isPending}>Save e-mail preferences</Button>
    </form>
  );
}
