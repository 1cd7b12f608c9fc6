import { type ReactNode, Suspense, useEffect, useState } from 'react';

/**
 * Renders `children` only once the page around it has been painted, inside a Suspense boundary.
 * For what sits below a screen's first view and comes from a lazy chunk: its chunk starts loading
 * after the first view shows, instead of competing with it for the network and the main thread.
 */
export function AfterFirstPaint({ children, fallback = null }: { children: ReactNode; fallback?: ReactNode }) {
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
  return painted ? <Suspense fallback={fallback}>{children}</Suspense> : fallback;
}
