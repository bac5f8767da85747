import { describe, expect, it } from 'vitest';
import { Semaphore } from '@/lib/semaphore';

describe('Semaphore', () => {
  it('lets at most `limit` holders in at once and hands each freed slot to the next waiter in order', async () => {
    const slots = new Semaphore(2);
    const a = (await slots.acquire(1000))!;
    const b = (await slots.acquire(1000))!;
    expect(slots.inUse).toBe(2);
    const order: string[] = [];
    const c = slots.acquire(1000).then((release) => (order.push('c'), release));
    const d = slots.acquire(1000).then((release) => (order.push('d'), release));
    expect(slots.queued).toBe(2);
    a();
    a(); // releasing twice frees one slot only
    (await c)!();
    b();
    (await d)!();
    expect(order).toEqual(['c', 'd']);
    expect(slots.inUse).toBe(0);
  });

  it('gives up on a wait that runs out, without taking a slot', async () => {
    const slots = new Semaphore(1);
    const held = (await slots.acquire(10))!;
    expect(await slots.acquire(20)).toBeUndefined();
    expect(slots.queued).toBe(0);
    held();
    const next = await slots.acquire(10);
    expect(next).toBeTypeOf('function');
    expect(slots.inUse).toBe(1);
  });
});
