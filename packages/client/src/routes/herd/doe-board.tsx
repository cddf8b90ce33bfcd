import type { LoaderFunctionArgs } from 'react-router-dom';
import { doeBoardQuerySchema, type DoeBoardDto, type DoeBoardSortKey } from '@burrowline/shared';
import { queryClient } from '../../app/query-client';
import { Alert } from '../../components/ui/alert';
import { Pagination } from '../../components/ui/data-table';
import { PageHeader } from '../../components/ui/page-header';
import { PageTitle } from '../../components/ui/page-title';
import { SegmentedFilter } from '../../components/ui/segmented-filter';
import { PageSpinner } from '../../components/ui/spinner';
import { doeBoardQueryOptions, useDoeBoard } from '../../features/doe-board/api/get-doe-board';
import { DoeBoardTable } from '../../features/doe-board/components/doe-board-table';
import { formatLongDay } from '../../lib/days';
import { useSession } from '../../lib/session';
import { readUrlState, useUrlState } from '../../lib/url-state';
import { HerdTabs } from './herd-tabs';

export async function loader({ request }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(doeBoardQueryOptions(readUrlState(doeBoardQuerySchema, new URL(request.url).searchParams)));
  return null;
}

const sortOptions: { value: DoeBoardSortKey; label: string }[] = [
  { value: 'due', label: 'What is due' },
  { value: 'state', label: 'Stage' },
  { value: 'tattoo', label: 'Tattoo' },
  { value: 'name', label: 'Name' },
];

const stateWords: Record<keyof DoeBoardDto['counts'], string> = {
  overdue: 'overdue', due: 'due to kindle', nursing: 'nursing', palpated_positive: 'palpated positive', serviced: 'serviced',
  resting: 'resting', open: 'open', growing: 'growing',
};

/** "2 nursing · 1 due to kindle · 3 open": the farm at a glance, busiest stages first. */
function Counts({ counts }: { counts: DoeBoardDto['counts'] }) {
  const parts = (Object.keys(stateWords) as (keyof typeof stateWords)[]).filter((s) => counts[s]).map((s) => `${counts[s]} ${stateWords[s]}`);
  if (parts.length === 0) return null;
  return <p className="text-grey-700">{parts.join(' · ')}</p>;
}

/** The doe board: every doe of the farm with where she stands and her next job; on a phone, the morning's round. */
export function DoeBoardPage() {
  const me = useSession();
  const [query, setQuery] = useUrlState(doeBoardQuerySchema);
  const board = useDoeBoard(query);
  return (
    <div className="space-y-6">
      <PageTitle>Doe board</PageTitle>
      <PageHeader
        title="Doe board"
        lead={board.data ? `Every doe of ${board.data.farm.name} and her next job, ${formatLongDay(board.data.today)}.` : 'Every doe of the farm and her next job.'}
      />
      <HerdTabs />
      {me.user.role === 'apprentice' && <Alert tone="info">You are reading your mentor's does. Record what you do in the Almanac; your mentor reviews it.</Alert>}
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <span className="font-semibold" id="doe-board-sort">Sort by</span>
        <SegmentedFilter label="Sort the does by" options={sortOptions} value={query.sort} onChange={(sort) => setQuery({ sort, dir: 'asc', page: 1 })} />
      </div>
      {board.isError ? (
        <Alert tone="error" title="The doe board did not load">
          {board.error.message}
        </Alert>
      ) : !board.data ? (
        <PageSpinner />
      ) : (
        <>
          <Counts counts={board.data.counts} />
          <DoeBoardTable
            does={board.data.items}
            today={board.data.today}
            query={query}
            isRefreshing={board.isPlaceholderData}
            onSort={(sort, dir) => setQuery({ sort, dir, page: 1 })}
          />
          <Pagination page={board.data.page} pageSize={board.data.pageSize} total={board.data.total} noun="does" onPage={(page) => setQuery({ page })} />
        </>
      )}
    </div>
  );
}
