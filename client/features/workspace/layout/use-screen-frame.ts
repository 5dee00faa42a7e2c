/**
 * The workspace is a tool screen: it takes the height left below the app bar and the room header,
 * never less than a 1366×768 laptop leaves, so the chart, the plot and the chain are all in view
 * without scrolling the page.
 */
import { useLayoutEffect, useState, type RefObject } from 'react';

export const MIN_WORKSPACE_HEIGHT = 540;
const BOTTOM_GAP = 12;

export function useScreenHeight(ref: RefObject<HTMLElement | null>): number {
  const [height, setHeight] = useState(MIN_WORKSPACE_HEIGHT);
  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    const measure = () => {
      const top = el.getBoundingClientRect().top + window.scrollY;
      setHeight(Math.max(MIN_WORKSPACE_HEIGHT, Math.floor(window.innerHeight - top - BOTTOM_GAP)));
    };
    measure();
    window.addEventListener('resize', measure);
    return () => window.removeEventListener('resize', measure);
  }, [ref]);
  return height;
}
