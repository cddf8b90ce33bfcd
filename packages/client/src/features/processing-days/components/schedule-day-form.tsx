import { Plus, Trash2 } from 'lucide-react';
import { FormProvider, useFieldArray, useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { DEFAULT_STATIONS, processingDayCreateSchema, type ProcessingDayCreateInput, type ProcessingSiteDto } from '@burrowline/shared';
import { centsFromText } from '../../ledger';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { TextField } from '../../../components/ui/text-field';
import { newIdempotencyKey } from '../../../lib/idempotency';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useScheduleDay } from '../api/processing-day-mutations';
import { CostLinesField, costLinesFromValues, type CostLineValues } from './cost-lines-field';

interface Values extends CostLineValues {
  id: string;
  siteId: string;
  date: string;
  startTime: string;
  capacity: string;
  deadline: string;
  fee: string;
  stations: { name: string; places: string }[];
  equipment: string;
  notes: string;
}

const simple = { siteId: 'siteId', date: 'date', startTime: 'startTime', capacityHead: 'capacity', signUpDeadline: 'deadline', feePerHeadCents: 'fee', equipment: 'equipment', notes: 'notes' } as const;

function fieldOf(path: string) {
  const cost = /^expectedCosts\.(\d+)\.(label|amountCents)/.exec(path);
  if (cost) return `costs.${Number(cost[1])}.${cost[2] === 'label' ? 'label' : 'amount'}` as const;
  const station = /^stations\.(\d+)\.(name|places)/.exec(path);
  if (station) return `stations.${Number(station[1])}.${station[2] === 'name' ? 'name' : 'places'}` as const;
  if (path.startsWith('stations')) return 'stations' as const;
  if (path.startsWith('expectedCosts')) return 'costs' as const;
  return simple[path.split('.')[0] as keyof typeof simple] ?? null;
}

const DEFAULT_COSTS = ['Bags and labels', 'Ice', 'Gas', 'Site fee'].map((label) => ({ label, amount: '0.00' }));

/**
 * The admin (or a host the admin allows) schedules a day at a site: when, how many head, the deadline, the
 * fee per head, the expected shared costs, the stations with their places, what equipment is needed.
 */
export function ScheduleDayForm({ sites, today }: { sites: ProcessingSiteDto[]; today: string }) {
  const schedule = useScheduleDay();
  const navigate = useNavigate();
  const form = useForm<Values, unknown, ProcessingDayCreateInput>({
    resolver: sharedSchemaResolver(
      processingDayCreateSchema,
      (v) => ({
        id: v.id,
        siteId: v.siteId,
        date: v.date,
        startTime: v.startTime,
        capacityHead: v.capacity.trim() === '' ? Number.NaN : Number(v.capacity),
        signUpDeadline: v.deadline,
        feePerHeadCents: centsFromText(v.fee),
        expectedCosts: costLinesFromValues(v.costs),
        stations: v.stations.map((s) => ({ name: s.name.trim(), places: Number(s.places) })),
        equipment: v.equipment.split('\n').map((e) => e.trim()).filter(Boolean).map((name) => ({ name })),
        notes: v.notes,
      }) as ProcessingDayCreateInput,
      fieldOf,
    ),
    defaultValues: {
      id: newIdempotencyKey(),
      siteId: sites[0]?.id ?? '',
      date: '',
      startTime: '08:00',
      capacity: sites[0] ? String(sites[0].capacityHeadPerDay) : '',
      deadline: '',
      fee: '',
      costs: DEFAULT_COSTS,
      stations: DEFAULT_STATIONS.map((s) => ({ name: s.name, places: String(s.places) })),
      equipment: 'Killing cone or bar\nSkinning gambrels\nChill tanks\nKnife sharpener\nScale\nCoolers',
      notes: '',
    },
  });
  const stations = useFieldArray({ control: form.control, name: 'stations' });
  const { errors } = form.formState;
  const { submit, failure } = useServerSubmit(form, schedule, { fields: fieldOf, onSuccess: (day) => void navigate(`/processing-days/${day.id}`) });
  const siteId = form.watch('siteId');
  const site = sites.find((s) => s.id === siteId);
  return (
    <FormProvider {...form}>
      <form onSubmit={submit} noValidate aria-label="Schedule a processing day" className="space-y-5">
        <div className="grid gap-3 sm:grid-cols-2">
          <SelectField
            label="Site"
            error={errors.siteId?.message}
            options={sites.map((s) => ({ value: s.id, label: `${s.name} (${s.hostFarmName})` }))}
            {...form.register('siteId', { onChange: (e: { target: { value: string } }) => {
              const next = sites.find((s) => s.id === e.target.value);
              if (next) form.setValue('capacity', String(next.capacityHeadPerDay));
            } })}
          />
          <TextField label="Capacity (head)" type="number" inputMode="numeric" min={1} hint={site ? `The site takes ${site.capacityHeadPerDay} a day; chill for ${site.chillCapacityHead} at once.` : undefined} error={errors.capacity?.message} {...form.register('capacity')} />
          <TextField label="Date" type="date" min={today} error={errors.date?.message} {...form.register('date')} />
          <TextField label="Start time" type="time" error={errors.startTime?.message} {...form.register('startTime')} />
          <TextField label="Sign-up deadline" type="date" min={today} hint="Booking, changing and cancelling close at the end of this day." error={errors.deadline?.message} {...form.register('deadline')} />
          <TextField label="Fee per head" inputMode="decimal" placeholder="0.00" error={errors.fee?.message} {...form.register('fee')} />
        </div>
        <CostLinesField legend="Expected shared costs" />
        <fieldset className="max-w-2xl space-y-2">
          <legend className="font-medium">Stations and their places</legend>
          {typeof errors.stations?.message === 'string' && <p className="text-sm font-medium text-clay-deep">{errors.stations.message}</p>}
          {stations.fields.map((field, i) => (
            <div key={field.id} className="grid grid-cols-[minmax(0,1fr)_5.5rem_auto] items-end gap-2">
              <TextField label={`Station ${i + 1}`} error={errors.stations?.[i]?.name?.message} {...form.register(`stations.${i}.name`)} />
              <TextField label="Places" type="number" inputMode="numeric" min={1} error={errors.stations?.[i]?.places?.message} {...form.register(`stations.${i}.places`)} />
              <Button variant="quiet" className="size-12 px-0" aria-label={`Remove station ${i + 1}`} onClick={() => stations.remove(i)}>
                <Trash2 className="size-5" aria-hidden="true" />
              </Button>
            </div>
          ))}
          <Button variant="secondary" onClick={() => stations.append({ name: '', places: '1' })}>
            <Plus className="size-4" aria-hidden="true" />
            Add a station
          </Button>
        </fieldset>
        <TextAreaField label="Equipment needed" hint="One item a line; members say who brings what." rows={6} error={errors.equipment?.message} {...form.register('equipment')} />
        <TextAreaField label="Notes for members" rows={3} error={errors.notes?.message} {...form.register('notes')} />
        {failure && <Alert tone="error">{failure}</Alert>}
        <Button type="submit" className="min-h-14 w-full text-lg sm:w-auto" isBusy={schedule.isPending}>Schedule the day</Button>
      </form>
    </FormProvider>
  );
}
