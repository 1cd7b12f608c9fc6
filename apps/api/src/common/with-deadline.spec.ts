import { describe, expect, it } from 'vitest';
import { withDeadline } from './with-deadline.js';

describe('withDeadline', () => {
  it('gives the work’s result when it settles in time', async () => {
    expect(await withDeadline(Promise.resolve(7), 1000)).toBe(7);
  });

  it('gives up on work that never settles', async () => {
    const started = Date.now();
    expect(await withDeadline(new Promise<never>(() => {}), 50)).toBe('timed-out');
    expect(Date.now() - started).toBeLessThan(1000);
  });

  it('passes on the work’s failure', async () => {
    await expect(withDeadline(Promise.reject(new Error('refused')), 1000)).rejects.toThrow('refused');
  });
});
