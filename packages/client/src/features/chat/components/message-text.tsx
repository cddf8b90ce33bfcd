import type { ReactNode } from 'react';

const LINK = /\bhttps?:\/\/[^\s<>"']+/gi;
// Closing punctuation that usually ends the sentence, not the link.
const TRAILING = /[.,;:!?)\]]+$/;

function escapeRegExp(text: string) {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

/** Only http(s) addresses become links; the text is never parsed as HTML. */
function linkified(text: string, keyPrefix: string): ReactNode[] {
  const parts: ReactNode[] = [];
  let last = 0;
  for (const match of text.matchAll(LINK)) {
    const start = match.index;
    let href = match[0];
    const trailing = TRAILING.exec(href)?.[0] ?? '';
    href = href.slice(0, href.length - trailing.length);
    let safe: URL | null;
    try {
      safe = new URL(href);
    } catch {
      safe = null;
    }
    if (!safe || (safe.protocol !== 'http:' && safe.protocol !== 'https:')) continue;
    if (start > last) parts.push(text.slice(last, start));
    parts.push(
      <a key={`${keyPrefix}-${start}`} href={safe.href} target="_blank" rel="noopener noreferrer nofollow ugc" className="break-all text-moss-deep underline underline-offset-2">
        {href}
      </a>,
    );
    last = start + href.length;
  }
  if (last < text.length) parts.push(text.slice(last));
  return parts;
}

/**
 * A message's plain text: links made clickable (http and https only, opened safely), the people it
 * mentions highlighted (you more strongly). React escapes everything else, so no user HTML is ever rendered.
 */
export function MessageText({ text, mentions, myName }: { text: string; mentions: { name: string }[]; myName: string }) {
  const names = [...new Set(mentions.map((m) => m.name))].sort((a, b) => b.length - a.length);
  if (names.length === 0) return <>{linkified(text, 't')}</>;
  const pattern = new RegExp(`(@(?:${names.map(escapeRegExp).join('|')}))`, 'g');
  return (
    <>
      {text.split(pattern).map((part, i) => {
        if (i % 2 === 1) {
          const mine = part === `@${myName}`;
          return (
            <mark key={`m-${i}`} className={mine ? 'rounded bg-straw px-0.5 font-semibold text-bark' : 'rounded bg-moss-wash px-0.5 font-semibold text-moss-deep'}>
              {part}
            </mark>
          );
        }
        return <span key={`p-${i}`}>{linkified(part, `p${i}`)}</span>;
      })}
    </>
  );
}
