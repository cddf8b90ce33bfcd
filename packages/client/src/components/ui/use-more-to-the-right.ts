import { useEffect, useRef, useState } from 'react';

/** Whether a scrolling box has more to its right than it shows (so the table can say so instead of hiding columns). */
export function useMoreToTheRight<E extends HTMLElement = HTMLDivElement>() {
  const ref = useRef<E>(null);
  const [more, setMore] = useState(false);
  useEffect(() => {
    const box = ref.current;
    if (!box) return;
    const check = () => setMore(box.scrollWidth - box.clientWidth - box.scrollLeft > 1);
    check();
    const observer = new ResizeObserver(check);
    observer.observe(box);
    box.addEventListener('scroll', check, { passive: true });
    return () => {
      observer.disconnect();
      box.removeEventListener('scroll', check);
    };
  }, []);
  return { ref, more };
}

