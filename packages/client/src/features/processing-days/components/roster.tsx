import { Check, UserPlus, Wrench } from 'lucide-react';
import type { ProcessingDayDto, StationDto } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { errorText } from '../../../lib/form-errors';
import { useClaimEquipment, useReleaseEquipment, useRosterLeave, useRosterSignUp } from '../api/processing-day-mutations';

interface RosterProps {
  day: ProcessingDayDto;
  userId: string;
  farmId: string | null;
}

/** The stations: who is on each and how many places are empty (one sign-up button each), and who brings which piece of equipment. */
export function Roster({ day, userId, farmId }: RosterProps) {
  const signUp = useRosterSignUp(day.id);
  const leave = useRosterLeave(day.id);
  const claim = useClaimEquipment(day.id);
  const release = useReleaseEquipment(day.id);
  const open = day.status === 'scheduled';
  const error = [signUp, leave, claim, release].find((m) => m.isError)?.error;
  const busy = signUp.isPending || leave.isPending;
  const onStation = (station: StationDto) => station.places.some((p) => p.userId === userId);
  return (
    <Card className="space-y-4" data-testid="roster">
      <h2 className="text-xl font-bold">Stations</h2>
      {error !== undefined && <Alert tone="error">{errorText(error)}</Alert>}
      <ul className="grid gap-3 md:grid-cols-2 xl:grid-cols-3">
        {day.stations.map((station) => (
          <li key={station.id} className="rounded-xl border border-grey-200 p-3" data-testid={`station-${station.name}`}>
            <p className="flex items-baseline justify-between gap-2">
              <span className="text-lg font-semibold">{station.name}</span>
              <span className="text-sm text-grey-700 tabular-nums">{station.filled} of {station.places.length}</span>
            </p>
            <ul className="mt-2 space-y-2">
              {station.places.filter((place) => place.userId).map((place) => {
                const mine = place.userId === userId;
                return (
                  <li key={place.id} className="flex min-h-12 items-center justify-between gap-2 rounded-lg bg-moss-wash px-3">
                    <span className={mine ? 'font-bold text-moss-deep' : 'font-medium'}>
                      {mine && <Check className="mr-1 inline size-4 align-[-2px]" aria-hidden="true" />}
                      {mine ? 'You' : place.userName}
                    </span>
                    {open && (mine || day.canEdit) && (
                      <Button variant="quiet" className="min-h-11 px-3" disabled={busy} onClick={() => leave.mutate({ stationId: station.id, userId: mine ? undefined : (place.userId ?? undefined) })} aria-label={mine ? `Leave ${station.name}` : `Take ${place.userName ?? 'them'} off ${station.name}`}>
                        {mine ? 'Leave' : 'Remove'}
                      </Button>
                    )}
                  </li>
                );
              })}
              {station.filled < station.places.length && (
                <li className="flex min-h-12 items-center justify-between gap-2 rounded-lg bg-oat/70 px-3">
                  <span className="text-grey-700">{station.places.length - station.filled} empty</span>
                  {open && !onStation(station) && (
                    <Button variant="secondary" className="min-h-11 px-3" disabled={busy} onClick={() => signUp.mutate({ stationId: station.id })} aria-label={`Sign up for ${station.name}`}>
                      <UserPlus className="size-4" aria-hidden="true" />
                      Sign up
                    </Button>
                  )}
                </li>
              )}
            </ul>
          </li>
        ))}
      </ul>
      {day.equipment.length > 0 && (
        <section aria-labelledby="equipment-title" className="space-y-2">
          <h3 id="equipment-title" className="flex items-center gap-2 text-lg font-semibold">
            <Wrench className="size-5" aria-hidden="true" />
            Who brings what
          </h3>
          <ul className="divide-y divide-grey-200 rounded-xl border border-grey-200">
            {day.equipment.map((item) => {
              const ours = farmId !== null && item.broughtByFarmId === farmId;
              return (
                <li key={item.id} className="flex min-h-12 flex-wrap items-center justify-between gap-2 px-3 py-1.5">
                  <span className="font-medium">{item.name}</span>
                  <span className="flex items-center gap-2">
                    <span className={item.broughtByFarmName ? 'text-bark' : 'text-clay-deep'}>{ours ? 'We bring it' : (item.broughtByFarmName ?? 'Nobody yet')}</span>
                    {open && farmId && !item.broughtByFarmId && (
                      <Button variant="secondary" className="px-3" disabled={claim.isPending} onClick={() => claim.mutate({ itemId: item.id, farmId })} aria-label={`We bring ${item.name}`}>
                        We bring it
                      </Button>
                    )}
                    {open && item.broughtByFarmId && (ours || day.canEdit) && (
                      <Button variant="quiet" className="px-3" disabled={release.isPending} onClick={() => release.mutate(item.id)} aria-label={`Nobody brings ${item.name} after all`}>
                        Undo
                      </Button>
                    )}
                  </span>
                </li>
              );
            })}
          </ul>
        </section>
      )}
    </Card>
  );
}
