import { useEffect, type RefObject } from 'react';

/**
 * Bars fixed to the bottom of the screen (a bulk-action bar) register their height here, and the
 * toast region sits above the tallest one, so a toast never covers a bar's controls. The height
 * is published as the CSS variable --pb-bottom-bar on the document element.
 */
const heights = new Map<symbol, number>();

function publish() {
  const tallest = Math.max(0, ...heights.values());
  document.documentElement.style.setProperty('--pb-bottom-bar', `${Math.ceil(tallest)}px`);
}

/** Reserve the bottom of the screen for this element while it is mounted. */
export function useBottomBar(ref: RefObject<HTMLElement | null>) {
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const key = Symbol('bottom-bar');
    const measure = () => {
      heights.set(key, el.getBoundingClientRect().height);
      publish();
    };
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(el);
    return () => {
      observer.disconnect();
      heights.delete(key);
      publish();
    };
  }, [ref]);
}
