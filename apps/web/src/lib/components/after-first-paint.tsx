import { type ReactNode, Suspense, useEffect, useState } from 'react';

/**
 * False until the page has been painted once after the component mounted, then true. An effect
 * alone is not late enough: React runs a sync render's effects before the browser paints.
 */
export function useAfterFirstPaint(): boolean {
  const [painted, setPainted] = useState(false);
  useEffect(() => {
    // The frame callback runs before the next paint; the task it queues runs after that paint.
    let timer: ReturnType<typeof setTimeout> | undefined;
    const frame = requestAnimationFrame(() => {
      timer = setTimeout(() => setPainted(true), 0);
    });
    return () => {
      cancelAnimationFrame(frame);
      clearTimeout(timer);
    };
  }, []);
  return painted;
}

/**
 * Renders `children` only once the page around it has been painted, inside a Suspense boundary.
 * For what sits below a screen's first view and comes from a lazy chunk: its chunk starts loading
 * after the first view shows, instead of competing with it for the network and the main thread.
 */
export function AfterFirstPaint({ children, fallback = null }: { children: ReactNode; fallback?: ReactNode }) {
  return useAfterFirstPaint() ? <Suspense fallback={fallback}>{children}</Suspense> : fallback;
}
