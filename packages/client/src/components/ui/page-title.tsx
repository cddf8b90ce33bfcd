/** React 19 hoists <title> into <head>, so each screen names itself in the tab and history. */
export function PageTitle({ children }: { children: string }) {
  return <title>{`${children} · Burrowline`}</title>;
}
