import { Card } from '../../../components/ui/card';
import { CheckboxField } from '../../../components/ui/checkbox-field';
import { SelectField } from '../../../components/ui/select-field';
import { useMorningEmail } from '../api/get-morning-email';
import { useUpdateMorningEmail } from '../api/update-morning-email';
import { errorText } from '../../../lib/form-errors';

const hours = Array.from({ length: 9 }, (_, i) => i + 3).map((h) => ({ value: String(h), label: `${h}:00 am` }));

/** The opt-in morning e-mail of the day's tasks and anything overdue. */
export function MorningEmailPanel() {
  const pref = useMorningEmail();
  const update = useUpdateMorningEmail();
  const data = pref.data;
  return (
    <Card className="space-y-3">
      <h2 className="text-lg font-bold">Morning e-mail</h2>
      <p className="text-grey-700">The day's tasks and anything overdue, in your inbox each morning (only on days with something in them).</p>
      {data && (
        <div className="space-y-3">
          <CheckboxField
            label="Send me the morning e-mail"
            checked={data.enabled}
            onChange={(e) => update.mutate({ enabled: e.target.checked, hour: data.hour })}
          />
          <SelectField
            label="From"
            hint={`On the farm's clock (${data.timeZone}).`}
            value={String(data.hour)}
            options={hours}
            onChange={(e) => update.mutate({ enabled: data.enabled, hour: Number(e.target.value) })}
          />
        </div>
      )}
      {update.isError && <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(update.error)}</p>}
    </Card>
  );
}
