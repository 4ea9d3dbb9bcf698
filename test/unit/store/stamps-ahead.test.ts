import { describe, expect, it, vi } from 'vitest';
import { MAX_CLOCK_SKEW_MS } from '../../../src/lib/domain';
import { moveStampsAheadOfTeamTime } from '../../../src/lib/store';
import { freshStore, seedPatient } from './store-helpers';

const HOUR = 3600_000;
const T0 = Date.UTC(2025, 4, 12, 8); // team time when the device first syncs (invented)
const iso = (ms: number) => new Date(ms).toISOString();

describe('moveStampsAheadOfTeamTime', () => {
  it('moves only stamps beyond team now + 10 min, by the measured offset, never past team now, audited once', async () => {
    let device = T0 + 6 * HOUR;
    const store = await freshStore({ now: () => device, passphrase: null });
    const patient = (code: string) => store.patients.create({ code, birthYear: 1958, condition: 'stroke', affectedSides: ['left'], status: 'active' });
    // Made while the clock ran 6 h fast and was then set back to 3 h fast (so stamped ahead of its own later clock).
    const early = await patient('K7QM-3XHD');
    device = T0 + 3 * HOUR;
    const fast = await patient('QW3E-7RTY');
    // A record stamped by an offset that was nearly right: 5 min ahead of team time, inside the margin.
    await store.clock.setOffset(-3 * HOUR + 5 * 60_000);
    const near = await patient('B4TR-9WXE');
    // The sync measures the offset: 3 h. Team now is T0.
    await store.clock.setOffset(-3 * HOUR);
    const teamNow = store.context.now();

    const moved = await moveStampsAheadOfTeamTime(store);
    const after = async (id: string) => (await store.patients.get(id))!;
    // Stamp − 3 h for the one made at a steady 3 h fast: its real time.
    expect((await after(fast.id)).updatedAt).toBe(iso(Date.parse(fast.updatedAt) - 3 * HOUR));
    // 6 h fast − 3 h would still be 3 h ahead: held at team now instead.
    expect((await after(early.id)).updatedAt).toBe(iso(Math.floor(teamNow)));
    expect((await after(early.id)).createdAt <= (await after(early.id)).updatedAt).toBe(true);
    // Inside the margin: untouched.
    expect((await after(near.id)).updatedAt).toBe(near.updatedAt);
    expect(Date.parse(near.updatedAt) - teamNow).toBeLessThan(MAX_CLOCK_SKEW_MS);
    // Content unchanged.
    const { createdAt: _c, updatedAt: _u, ...fastContent } = fast;
    const { createdAt: _c2, updatedAt: _u2, ...fastAfter } = await after(fast.id);
    expect(fastAfter).toEqual(fastContent);
    // Every moved record is beyond the limit it was judged by, and one audit entry names each with both stamps.
    expect(moved.map((m) => m.id)).toEqual(expect.arrayContaining([early.id, fast.id]));
    expect(moved.map((m) => m.id)).not.toContain(near.id);
    for (const m of moved) expect(Date.parse(m.from.updatedAt)).toBeGreaterThan(teamNow + MAX_CLOCK_SKEW_MS);
    const entries = (await store.db.table('audit').toArray()) as { table: string; before: { stamps?: { id: string; updatedAt: string }[] } | null; after: { stamps?: { id: string; updatedAt: string }[]; offsetMs?: number } | null }[];
    const moves = entries.filter((e) => e.after?.stamps !== undefined);
    expect(moves.length).toBe(1);
    expect(moves[0]!.after!.offsetMs).toBe(-3 * HOUR);
    expect(moves[0]!.before!.stamps!.find((s) => s.id === fast.id)!.updatedAt).toBe(fast.updatedAt);
    expect(moves[0]!.after!.stamps!.find((s) => s.id === fast.id)!.updatedAt).toBe((await after(fast.id)).updatedAt);
    // Nothing is left ahead: a second pass moves nothing and writes no entry.
    expect(await moveStampsAheadOfTeamTime(store)).toEqual([]);
    expect(((await store.db.table('audit').toArray()) as { after: { stamps?: unknown } | null }[]).filter((e) => e.after?.stamps !== undefined).length).toBe(1);
  });

  it('opens no read-write transaction when nothing is ahead of team time (the usual sync), and writes nothing', async () => {
    const store = await freshStore();
    await seedPatient(store);
    // A clock that was right: offset 0, every stamp at or before team now.
    await store.clock.setOffset(0);
    const auditBefore = await store.db.table('audit').count();
    const modes: string[] = [];
    const original = store.db.transaction.bind(store.db) as (...args: unknown[]) => unknown;
    const spy = vi.spyOn(store.db, 'transaction').mockImplementation(((...args: unknown[]) => {
      modes.push(String(args[0]));
      return original(...args);
    }) as never);
    expect(await moveStampsAheadOfTeamTime(store)).toEqual([]);
    spy.mockRestore();
    // It did look (so the test sees the mode it looked in), and no look took a write lock.
    expect(modes.length).toBeGreaterThan(0);
    expect(modes.filter((m) => m.includes('w'))).toEqual([]);
    expect(await store.db.table('audit').count()).toBe(auditBefore);
  });
});
