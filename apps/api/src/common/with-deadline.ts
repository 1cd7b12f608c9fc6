/**
 * Waits for `work`, but no longer than `ms`: 'timed-out' then, and the work is left to finish (or
 * not) on its own. For shutdown steps: a connection an outage broke must not hold the process
 * open for ever, since a process manager stops waiting and kills it anyway.
 */
export async function withDeadline<T>(work: Promise<T>, ms: number): Promise<T | 'timed-out'> {
  let timer: NodeJS.Timeout | undefined;
  const deadline = new Promise<'timed-out'>((resolve) => {
    timer = setTimeout(() => resolve('timed-out'), ms);
    timer.unref();
  });
  try {
    return await Promise.race([work, deadline]);
  } finally {
    clearTimeout(timer);
  }
}
