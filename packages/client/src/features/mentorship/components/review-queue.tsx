import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { reviewDecisionSchema, type ReviewDecisionInput, type ReviewItemDto, type ReviewItemKind } from '@burrowline/shared';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/select-field';
import { Spinner } from '../../../components/ui/spinner';
import { TextAreaField } from '../../../components/ui/text-area-field';
import { errorText } from '../../../lib/form-errors';
import { sharedSchemaResolver } from '../../../lib/shared-schema-resolver';
import { useServerSubmit } from '../../../lib/use-server-submit';
import { useAcceptMany, useDecide } from '../api/mentorship-mutations';
import { useReviewQueue } from '../api/mentorship-queries';
import { ChoreCard } from './chore-card';

const kindLabels: Record<ReviewItemKind, string> = { chore: 'Chore', palpation: 'Palpation', 'weigh-in': 'Weigh-in', note: 'Note', 'litter-event': 'Litter count', task: 'Task tick' };

function ReturnForm({ item, onDone }: { item: ReviewItemDto; onDone: () => void }) {
  const decide = useDecide(item.kind, item.id);
  const form = useForm<{ comment: string }, unknown, ReviewDecisionInput>({
    resolver: sharedSchemaResolver(reviewDecisionSchema, (v) => ({ decision: 'returned' as const, comment: v.comment })),
    defaultValues: { comment: '' },
  });
  const { submit, failure } = useServerSubmit(form, decide, { fields: ['comment'], onSuccess: onDone });
  return (
    <form onSubmit={submit} noValidate className="space-y-2" aria-label="Return with a comment">
      <TextAreaField label="What should she correct?" rows={2} error={form.formState.errors.comment?.message} {...form.register('comment')} />
      {failure && <Alert tone="error">{failure}</Alert>}
      <Button type="submit" variant="danger" isBusy={decide.isPending}>Return to her</Button>
    </form>
  );
}

function ReviewCard({ item, canReview, selected, onSelect }: { item: ReviewItemDto; canReview: boolean; selected: boolean; onSelect: (on: boolean) => void }) {
  const accept = useDecide(item.kind, item.id);
  const [returning, setReturning] = useState(false);
  const actions = canReview && (
    <div className="space-y-3 border-t border-grey-200 pt-3">
      <div className="flex flex-wrap items-center gap-2">
        <label className="inline-flex min-h-11 items-center gap-2 pr-2 font-semibold text-bark">
          <input type="checkbox" className="size-5 accent-moss" checked={selected} onChange={(e) => onSelect(e.target.checked)} />
          Select
        </label>
        <Button isBusy={accept.isPending} onClick={() => accept.mutate({ decision: 'accepted', comment: '' })}>Accept</Button>
        <Button variant="secondary" aria-expanded={returning} onClick={() => setReturning((r) => !r)}>Return…</Button>
      </div>
      {accept.error ? <Alert tone="error">{errorText(accept.error)}</Alert> : null}
      {returning && <ReturnForm item={item} onDone={() => setReturning(false)} />}
    </div>
  );
  if (item.chore) {
    return (
      <li>
        <ChoreCard entry={item.chore} showApprentice>{actions}</ChoreCard>
      </li>
    );
  }
  return (
    <li>
      <article className="space-y-2 rounded-xl border border-grey-200 bg-white p-4" aria-label={`${item.title} on ${item.on}`}>
        <div className="flex flex-wrap items-start justify-between gap-2">
          <div className="min-w-0">
            <h3 className="font-bold text-bark">{item.title}</h3>
            <p className="text-sm text-grey-600">{item.apprentice.name} · {item.on}</p>
          </div>
          <Badge tone="straw">{kindLabels[item.kind]}</Badge>
        </div>
        <p className="break-words text-grey-700">{item.detail}</p>
        {actions}
      </article>
    </li>
  );
}

/** The mentor's one queue: everything her apprentices sent, oldest first; accept, return with a comment, or accept many. */
export function ReviewQueue({ apprenticeId, kind, onFilter }: { apprenticeId: string; kind: string; onFilter: (patch: { apprenticeId?: string; kind?: string }) => void }) {
  const queue = useReviewQueue(apprenticeId, kind);
  const acceptMany = useAcceptMany();
  const [selected, setSelected] = useState<Set<string>>(new Set());
  if (!queue.data) return <Spinner label="Loading the queue" />;
  const { items, apprentices, canReview } = queue.data;
  const keyOf = (i: ReviewItemDto) => `${i.kind}:${i.id}`;
  const chosen = items.filter((i) => selected.has(keyOf(i)));
  return (
    <div className="space-y-4">
      <div className="grid gap-3 sm:grid-cols-2 lg:max-w-2xl">
        <SelectField
          label="Apprentice"
          value={apprenticeId}
          onChange={(e) => onFilter({ apprenticeId: e.target.value })}
          options={[{ value: '', label: 'All apprentices' }, ...apprentices.map((a) => ({ value: a.id, label: a.name }))]}
        />
        <SelectField
          label="Kind"
          value={kind}
          onChange={(e) => onFilter({ kind: e.target.value })}
          options={[{ value: '', label: 'Everything' }, ...Object.entries(kindLabels).map(([value, label]) => ({ value, label }))]}
        />
      </div>
      {!canReview && items.length > 0 && <Alert>You can read these entries; each apprentice's mentor accepts or returns them.</Alert>}
      {canReview && items.length > 0 && (
        <div className="flex flex-wrap items-center gap-3">
          <Button variant="secondary" onClick={() => setSelected(new Set(items.map(keyOf)))}>Select all</Button>
          <Button
            disabled={chosen.length === 0}
            isBusy={acceptMany.isPending}
            onClick={() => acceptMany.mutate({ items: chosen.map((i) => ({ kind: i.kind, id: i.id })) }, { onSuccess: () => setSelected(new Set()) })}
          >
            {`Accept ${chosen.length} selected`}
          </Button>
          {acceptMany.error ? <Alert tone="error">{errorText(acceptMany.error)}</Alert> : null}
        </div>
      )}
      {items.length === 0 ? (
        <p className="rounded-xl border border-dashed border-grey-300 p-6 text-center text-grey-600">Nothing waits for review.</p>
      ) : (
        <ol className="space-y-3" aria-label="Waiting for review, oldest first">
          {items.map((item) => (
            <ReviewCard
              key={keyOf(item)}
              item={item}
              canReview={canReview && apprentices.some((a) => a.id === item.apprentice.id)}
              selected={selected.has(keyOf(item))}
              onSelect={(on) => setSelected((s) => {
                const next = new Set(s);
                if (on) next.add(keyOf(item));
                else next.delete(keyOf(item));
                return next;
              })}
            />
          ))}
        </ol>
      )}
    </div>
  );
}
