import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Search } from 'lucide-react';
import { useChatSearch } from '../api/chat-api';

/** Renders PostgreSQL's headline, whose matches come marked with « », as text with <mark>: never as HTML. */
function Snippet({ text }: { text: string }) {
  return (
    <>
      {text.split(/«|»/).map((part, i) => (i % 2 === 1 ? <mark key={i} className="rounded bg-straw-wash px-0.5">{part}</mark> : <span key={i}>{part}</span>))}
    </>
  );
}

/** Searches the messages of the threads the person may read. */
export function ChatSearch() {
  const [draft, setDraft] = useState('');
  const [q, setQ] = useState('');
  const results = useChatSearch(q);
  return (
    <div className="space-y-2">
      <form
        role="search"
        className="flex gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          setQ(draft.trim());
        }}
      >
        <label htmlFor="chat-search" className="sr-only">Search messages</label>
        <input id="chat-search" type="search" value={draft} onChange={(e) => setDraft(e.target.value)} placeholder="Search messages" className="min-h-11 min-w-0 flex-1 rounded-lg border border-grey-300 px-3" />
        <button type="submit" className="inline-flex size-11 items-center justify-center rounded-lg bg-moss text-white" aria-label="Search">
          <Search className="size-5" aria-hidden="true" />
        </button>
      </form>
      {q.length >= 2 && results.data && (
        <ul className="space-y-1" aria-label="Search results">
          {results.data.length === 0 && <li className="text-grey-600">Nothing found for “{q}”.</li>}
          {results.data.map((hit) => (
            <li key={hit.message.id}>
              <Link to={`/chat/${hit.message.threadId}?message=${hit.message.id}`} className="block rounded-lg border border-grey-200 bg-white px-3 py-2 hover:bg-grey-50">
                <span className="block text-sm font-semibold text-grey-700">{hit.threadTitle} · {hit.message.author.name}</span>
                <span className="block text-bark"><Snippet text={hit.snippet} /></span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
