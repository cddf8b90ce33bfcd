import { useState } from 'react';
import type { ProcessingMarkDto } from '@burrowline/shared';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { SelectField, type SelectOption } from '../../../components/ui/select-field';
import { errorText } from '../../../lib/form-errors';
import { subjectName } from '../../../lib/names';
import { formatDate } from '../../../lib/days';
import { useCancelMark } from '../api/processing-mutations';
import { MarkForProcessing } from './mark-for-processing';

/** Animals and groups set aside for a processing day, and marking another (members only). */
export function MarksCard({ marks, today, canEdit, animals, groups }: { marks: ProcessingMarkDto[]; today: string; canEdit: boolean; animals: SelectOption[]; groups: SelectOption[] }) {
  const cancel = useCancelMark();
  const [choice, setChoice] = useState('');
  const [kind, id] = choice.split(':') as ['animal' | 'group' | '', string | undefined];
  return (
    <Card className="space-y-4">
      <h2 className="text-lg font-bold">Marked for processing</h2>
      {marks.length === 0 ? (
        <p className="text-grey-600">Nothing is marked for processing.</p>
      ) : (
        <ul className="divide-y divide-grey-200">
          {marks.map((m) => (
            <li key={m.id} className="flex flex-wrap items-center justify-between gap-3 py-2">
              <span>
                <strong>{subjectName(m)}</strong> · {formatDate(m.plannedOn)}
                {m.notes ? <span className="text-grey-600"> · {m.notes}</span> : null}
                {m.withdrawalEndsOn && (
                  <span className="block text-sm font-medium text-clay-deep">Under withdrawal until {formatDate(m.withdrawalEndsOn)}: not before the day after</span>
                )}
              </span>
              {canEdit && (
                <Button variant="secondary" onClick={() => cancel.mutate({ id: m.id, version: m.version })} isBusy={cancel.isPending && cancel.variables?.id === m.id}>
                  Cancel the mark
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      {cancel.isError && <p role="alert" className="text-sm font-medium text-clay-deep">{errorText(cancel.error)}</p>}
      {canEdit && (
        <div className="space-y-3 border-t border-grey-200 pt-4">
          <SelectField
            label="Mark an animal or group"
            value={choice}
            onChange={(e) => setChoice(e.target.value)}
            options={[
              { value: '', label: 'Choose one' },
              ...groups.map((g) => ({ value: `group:${g.value}`, label: `Group: ${g.label}` })),
              ...animals.map((a) => ({ value: `animal:${a.value}`, label: a.label })),
            ]}
          />
          {id && <MarkForProcessing key={choice} today={today} {...(kind === 'group' ? { groupId: id } : { animalId: id })} />}
        </div>
      )}
    </Card>
  );
}
