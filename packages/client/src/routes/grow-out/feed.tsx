import { useEffect, useRef, useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { centsPerLb, feedBookQuerySchema, type FeedPurchaseDto, type FeedUseDto } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Button } from '../../components/ui/button';
import { Card } from '../../components/ui/card';
import { Pagination } from '../../components/ui/data-table';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { formatDate } from '../../lib/days';
import { readUrlState, useUrlState } from '../../lib/url-state';
import { PageSpinner } from '../../components/ui/spinner';
import { feedQueryOptions, useFeed } from '../../features/feed/api/get-feed';
import { BookProblems, FeedUseForm, PurchaseForm } from '../../features/feed/components/feed-forms';
import { useRemoveFeedUse, useRemovePurchase } from '../../features/feed/api/record-feed';
import { useMoney } from '../../lib/money';
import { weight } from '../../lib/weights';
import { useWeightUnit } from '../../features/herd/hooks/use-weight-unit';

export async function loader({ request }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(feedQueryOptions(readUrlState(feedBookQuerySchema, new URL(request.url).searchParams)));
  return null;
}

/** A line of the feed book a member may correct or remove. */
type BookEntry = { purchase: FeedPurchaseDto } | { use: FeedUseDto };

const allocationWords = { head_days: 'split by head-days', live_weight: 'split by live weight' } as const;

/** /grow-out/feed: feed bought and feed given, with the stock left in each purchase. */
export function FeedPage() {
  const [page, setPage] = useUrlState(feedBookQuerySchema);
  const { data: book, isPlaceholderData, isError, error } = useFeed(page);
  const unit = useWeightUnit();
  const money = useMoney();
  const [correcting, setCorrecting] = useState<BookEntry | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);
  const [corrected, setCorrected] = useState(false);
  const doneCorrecting = (saved: boolean) => {
    setCorrected(saved);
    setCorrecting(null);
  };
  const removePurchase = useRemovePurchase();
  const removeUse = useRemoveFeedUse();
  const purchaseCard = useRef<HTMLDivElement>(null);
  const useCard = useRef<HTMLDivElement>(null);
  const editingPurchase = correcting && 'purchase' in correcting ? correcting.purchase : undefined;
  const editingUse = correcting && 'use' in correcting ? correcting.use : undefined;
  // The form being corrected comes into view (on a phone the two forms are stacked far above the lists).
  useEffect(() => {
    if (correcting) ('purchase' in correcting ? purchaseCard : useCard).current?.scrollIntoView({ behavior: 'smooth', block: 'start' });
  }, [correcting]);
  const entryActions = (entry: BookEntry, what: string) => {
    const { id, version } = 'purchase' in entry ? entry.purchase : entry.use;
    const remove = 'purchase' in entry ? removePurchase : removeUse;
    return confirming === id ? (
      <span className="flex flex-wrap gap-2">
        <Button variant="danger" isBusy={remove.isPending} onClick={() => remove.mutate({ id, version }, { onSettled: () => setConfirming(null) })}>
          Remove<span className="sr-only"> {what}</span>
        </Button>
        <Button variant="quiet" onClick={() => setConfirming(null)}>Keep</Button>
      </span>
    ) : (
      <span className="flex flex-wrap gap-1">
        <Button variant="quiet" className="px-2" onClick={() => { setCorrected(false); setCorrecting(entry); }}>
          Correct<span className="sr-only"> {what}</span>
        </Button>
        <Button variant="quiet" className="px-2" onClick={() => { removePurchase.reset(); removeUse.reset(); setConfirming(id); }}>
          Remove<span className="sr-only"> {what}</span>
        </Button>
      </span>
    );
  };
  if (isError && !book) return <Alert tone="error" title="The feed book did not load">{error.message}</Alert>;
  if (!book) return <PageSpinner />;
  return (
    <div className="space-y-6">
      <PageTitle>Feed</PageTitle>
      <PageHeader title="Feed" lead="What was bought and what was given, so each group's feed conversion and cost rest on the farm's own feed book." />
      <section aria-label="Stock left" className="flex flex-wrap gap-3">
        {book.products.length === 0 ? (
          <p className="text-grey-600">No feed bought yet.</p>
        ) : (
          book.products.map((p) => (
            <p key={p.name} className="rounded-xl border border-grey-200 bg-white px-4 py-2 shadow-sm">
              <span className="font-semibold">{p.name}</span>: {weight(p.gramsLeft, unit)} left
            </p>
          ))
        )}
      </section>
      {corrected && <Alert tone="success">Correction saved: the stock, costs and the groups' feed follow it.</Alert>}
      {book.canEdit && (
        <div className="grid gap-6 lg:grid-cols-2">
          <Card ref={purchaseCard} className={editingPurchase ? 'scroll-mt-4 ring-2 ring-straw' : 'scroll-mt-4'}>
            <h2 className="mb-3 text-lg font-semibold">{editingPurchase ? `Correct the purchase of ${formatDate(editingPurchase.boughtOn)}` : 'Feed bought'}</h2>
            <PurchaseForm key={editingPurchase ? `${editingPurchase.id}:${editingPurchase.version}` : 'new'} unit={unit} editing={editingPurchase} onDone={doneCorrecting} />
          </Card>
          <Card ref={useCard} className={editingUse ? 'scroll-mt-4 ring-2 ring-straw' : 'scroll-mt-4'}>
            <h2 className="mb-3 text-lg font-semibold">{editingUse ? `Correct the feed given on ${formatDate(editingUse.givenOn)}` : 'Feed given'}</h2>
            {book.products.length === 0 ? (
              <p className="text-grey-600">Record a purchase first: feed cannot be given before it was bought.</p>
            ) : (
              <FeedUseForm key={editingUse ? `${editingUse.id}:${editingUse.version}` : 'new'} book={book} unit={unit} editing={editingUse} onDone={doneCorrecting} />
            )}
          </Card>
        </div>
      )}
      <Card>
        <h2 className="mb-3 text-lg font-semibold">Purchases</h2>
        <BookProblems error={removePurchase.error} />
        {book.purchases.length === 0 ? (
          <p className="text-grey-600">None yet.</p>
        ) : (
          <>
            <table className="hidden w-full text-left md:table">
              <caption className="sr-only">Feed purchases</caption>
              <thead className="text-sm text-grey-600">
                <tr>
                  <th className="py-2">Bought</th>
                  <th>Feed</th>
                  <th className="text-right">Bags</th>
                  <th className="text-right">Bought</th>
                  <th className="text-right">Left</th>
                  <th className="text-right">Protein</th>
                  {book.canSeeMoney && <th className="text-right">Price</th>}
                  {book.canSeeMoney && <th className="text-right">{unit === 'lb_oz' ? 'Per lb' : 'Per kg'}</th>}
                  {book.canEdit && <th><span className="sr-only">Corrections</span></th>}
                </tr>
              </thead>
              <tbody className="divide-y divide-grey-200">
                {book.purchases.map((p) => (
                  <tr key={p.id}>
                    <td className="py-2">{formatDate(p.boughtOn)}</td>
                    <td>{p.productName}</td>
                    <td className="text-right">{p.bags} × {weight(p.bagGrams, unit)}</td>
                    <td className="text-right">{weight(p.grams, unit)}</td>
                    <td className="text-right font-semibold">{weight(p.gramsLeft, unit)}</td>
                    <td className="text-right">{p.crudeProteinPercent === null ? '—' : `${p.crudeProteinPercent} %`}</td>
                    {book.canSeeMoney && <td className="text-right">{money(p.priceCents)}</td>}
                    {book.canSeeMoney && <td className="text-right">{money(unit === 'lb_oz' && p.priceCents !== null ? Math.round(centsPerLb(p.priceCents, p.grams)) : p.centsPerKg)}</td>}
                    {book.canEdit && <td className="pl-2 text-right">{entryActions({ purchase: p }, `the purchase of ${formatDate(p.boughtOn)}`)}</td>}
                  </tr>
                ))}
              </tbody>
            </table>
            <ul className="space-y-3 md:hidden" aria-label="Feed purchases">
              {book.purchases.map((p) => (
                <li key={p.id} className="rounded-xl border border-grey-200 p-3">
                  <p className="font-semibold">{p.productName}</p>
                  <p className="text-sm">
                    {formatDate(p.boughtOn)} · {p.bags} × {weight(p.bagGrams, unit)}{p.crudeProteinPercent !== null ? ` · ${p.crudeProteinPercent} % protein` : ''}
                  </p>
                  <p>
                    <strong>{weight(p.gramsLeft, unit)}</strong> left of {weight(p.grams, unit)}{book.canSeeMoney ? ` · ${money(p.priceCents)}` : ''}
                  </p>
                  {book.canEdit && <div className="-ml-2 mt-1">{entryActions({ purchase: p }, `the purchase of ${formatDate(p.boughtOn)}`)}</div>}
                </li>
              ))}
            </ul>
          </>
        )}
      </Card>
      <Card>
        <h2 className="mb-3 text-lg font-semibold">Feed given</h2>
        <BookProblems error={removeUse.error} />
        {book.uses.length === 0 ? (
          <p className="text-grey-600">None yet.</p>
        ) : (
          <ul className={`divide-y divide-grey-200 transition-opacity ${isPlaceholderData ? 'opacity-60' : ''}`} aria-label="Feed given" aria-busy={isPlaceholderData || undefined}>
            {book.uses.map((u) => (
              <li key={u.id} className="py-3">
                <p>
                  <strong>{formatDate(u.givenOn)}</strong>
                  {u.fromOn !== u.givenOn && <span className="text-grey-600"> (from {formatDate(u.fromOn)})</span>}: {weight(u.grams, unit)} of {u.productName} to {u.targetLabel}
                  {u.allocation ? `, ${allocationWords[u.allocation]}` : ''}
                  {book.canSeeMoney && u.costCents !== null ? ` · ${money(u.costCents)}` : ''}
                </p>
                {u.shares.length > 0 && (u.target === 'pen' || u.target === 'farm') && (
                  <p className="text-sm text-grey-700">{u.shares.map((s) => `${s.label} ${weight(s.grams, unit)}`).join(' · ')}</p>
                )}
                {u.target === 'doe' && u.shares.length === 0 && <p className="text-sm text-grey-600">No litter with her then: counted as her own upkeep.</p>}
                {book.canEdit && <div className="-ml-2 mt-1">{entryActions({ use: u }, `the feed given on ${formatDate(u.givenOn)}`)}</div>}
              </li>
            ))}
          </ul>
        )}
        <div className="mt-3">
          <Pagination page={book.usesPage} pageSize={book.usesPageSize} total={book.usesTotal} noun="entries" onPage={(next) => setPage({ page: next })} />
        </div>
      </Card>
    </div>
  );
}
