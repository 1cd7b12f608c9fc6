import { describe, expect, it } from 'vitest';
import { Slots } from './stream-slots.js';

describe('Slots', () => {
  it('lets `size` holders in at once and the rest in arrival order as slots are released', async () => {
    const slots = new Slots(2);
    const order: string[] = [];
    const a = await slots.acquire();
    const b = await slots.acquire();
    const c = slots.acquire().then((release) => (order.push('c'), release));
    const d = slots.acquire().then((release) => (order.push('d'), release));
    await new Promise((r) => setTimeout(r, 10));
    expect(order).toEqual([]);
    a();
    a(); // releasing twice frees one slot only
    const releaseC = await c;
    await new Promise((r) => setTimeout(r, 10));
    expect(order).toEqual(['c']);
    b();
    const releaseD = await d;
    expect(order).toEqual(['c', 'd']);
    releaseC();
    releaseD();
    // both free again: two immediate acquisitions
    const [e, f] = await Promise.all([slots.acquire(), slots.acquire()]);
    e();
    f();
  });
});
