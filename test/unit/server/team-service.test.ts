import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BACKENDS, DEMO, enrolDevice, harness, openBackend, randomAuth, simulatedObservations, teamWithAdmin, type Harness } from './team-fixture';

describe.each(BACKENDS)('team server API on %s', (kind) => {
  let h: Harness;
  beforeAll(async () => {
    h = harness(await openBackend(kind), { enrolLimit: 5 });
  }, 300_000); // the first PGlite template on a machine runs initdb in WebAssembly: slow on a loaded machine
  afterAll(async () => {
    await h?.db.close();
  });

  it('an init code works once; a wrong or spent code is refused; enrolment is rate limited per address', async () => {
    const team = await h.service.createTeam('Rate team');
    const auth = team.code.replace(/-/g, '').slice(0, 10);
    const first = await h.call('POST', '/v1/enrol', null, { auth, label: 'first admin' }, '10.9.0.1');
    expect(first.status).toBe(200);
    expect(first.json.role).toBe('admin');
    expect((await h.call('POST', '/v1/enrol', null, { auth, label: 'again' }, '10.9.0.1')).status).toBe(401);
    for (let i = 0; i < 3; i++) expect((await h.call('POST', '/v1/enrol', null, { auth: randomAuth(), label: 'guess' }, '10.9.0.1')).status).toBe(401);
    // The sixth attempt from this address within the window is refused before the code is looked at.
    expect((await h.call('POST', '/v1/enrol', null, { auth: randomAuth(), label: 'guess' }, '10.9.0.1')).status).toBe(429);
    expect((await h.call('POST', '/v1/enrol', null, { auth: randomAuth(), label: 'guess' }, '10.9.0.2')).status).toBe(401);
  });

  it('the server keeps only a hash of a device token; a revoked device is refused; admins only issue and revoke', async () => {
    const { adminToken } = await teamWithAdmin(h, 'Token team');
    const clinician = await enrolDevice(h, adminToken, 'clinician');
    const rows = await h.db.query<{ token_hash: string }>('SELECT token_hash FROM devices');
    expect(rows.some((r) => r.token_hash.includes(clinician.token))).toBe(false);
    expect((await h.call('GET', '/v1/me', clinician.token)).json.role).toBe('clinician');
    expect((await h.call('POST', '/v1/codes', clinician.token, { auth: randomAuth(), role: 'admin', ttlMs: 60_000, keyEnvelope: '{}' })).status).toBe(403);
    expect((await h.call('POST', '/v1/codes', adminToken, { auth: randomAuth(), role: 'auditor', ttlMs: 60_000, keyEnvelope: '{"v":1}' })).status).toBe(400);
    const listed = (await h.call('GET', '/v1/devices', adminToken)).json.devices as { id: string; role: string; lastSeenAt: string | null; createdAt: string; revoked: boolean }[];
    const seen = listed.find((d) => d.id === clinician.deviceId)!;
    expect(seen).toMatchObject({ role: 'clinician', revoked: false });
    expect(Date.parse(seen.lastSeenAt!)).toBeGreaterThanOrEqual(Date.parse(seen.createdAt) - 1000);
    const adminId = listed.find((d) => d.role === 'admin')!.id;
    const self = await h.call('POST', `/v1/devices/${adminId}/revoke`, adminToken);
    expect(self.status).toBe(400);
    expect(self.json.error).toMatch(/cannot revoke itself/);
    expect((await h.call('POST', `/v1/devices/${clinician.deviceId}/revoke`, adminToken)).status).toBe(200);
    expect(((await h.call('GET', '/v1/devices', adminToken)).json.devices as { id: string; revoked: boolean }[]).find((d) => d.id === clinician.deviceId)!.revoked).toBe(true);
    const refused = await h.call('GET', '/v1/pull?cursor=0', clinician.token);
    expect(refused.status).toBe(401);
    expect(refused.json.error).toMatch(/revoked/);
    expect((await h.call('GET', '/v1/pull?cursor=0', null)).status).toBe(401);
  });

  it('an expired code is refused', async () => {
    const { adminToken } = await teamWithAdmin(h, 'Expiry team');
    const auth = randomAuth();
    expect((await h.call('POST', '/v1/codes', adminToken, { auth, role: 'clinician', ttlMs: 60_000, keyEnvelope: '{"v":1}' })).status).toBe(200);
    await h.db.query("UPDATE enrolment_codes SET expires_at = now() - interval '1 second' WHERE used_at IS NULL");
    expect((await h.call('POST', '/v1/enrol', null, { auth, label: 'late' }, '10.8.0.1')).status).toBe(401);
  });

  it('a push is validated whole with the domain schemas: clear names and bad values are refused, nothing written', async () => {
    const { adminToken } = await teamWithAdmin(h, 'Validation team');
    const good = simulatedObservations(3, 1, DEMO.devices[0]!.id).map((record) => ({ table: 'observations', record }));
    const identity = DEMO.identities[0]!;
    const clearName = await h.call('POST', '/v1/push', adminToken, { records: [...good, { table: 'identities', record: { ...identity, sealed: { iv: 'AAAAAAAAAAAAAAAA', ct: 'AAAA' } } }] });
    expect(clearName.status).toBe(400);
    expect(clearName.json.error).toMatch(/records\[3\] \(identities .*familyName: must not travel in clear/);
    const badAngle = { ...good[0]!.record, value: { kind: 'angle', angleDeg: 'wide' } };
    const bad = await h.call('POST', '/v1/push', adminToken, { records: [good[1], { table: 'observations', record: badAngle }] });
    expect(bad.status).toBe(400);
    expect(bad.json.error).toMatch(/records\[1\].*value/);
    // A device whose clock runs an hour fast: its stamps would be refused by every other device's
    // pull (10 minutes of clock difference allowed there), so the server refuses them first.
    const ahead = new Date(Date.now() + 3_600_000).toISOString();
    const future = await h.call('POST', '/v1/push', adminToken, { records: [good[2], { table: 'observations', record: { ...good[0]!.record, updatedAt: ahead } }] });
    expect(future.status).toBe(400);
    expect(future.json.error).toMatch(/records\[1\].*updatedAt: .* later than the team server's clock allows/);
    const pulled = await h.call('GET', '/v1/pull?cursor=0', adminToken);
    expect(pulled.json.records).toEqual([]);
  });

  it('pushes are idempotent and merge like backups: newer wins, ties by content, tombstones travel, each conflict recorded once', async () => {
    const { adminToken } = await teamWithAdmin(h, 'Merge team');
    const b = await enrolDevice(h, adminToken, 'clinician');
    const [one, two] = simulatedObservations(2, 2, DEMO.devices[0]!.id);
    const batch = { records: [{ table: 'observations', record: one }, { table: 'observations', record: two }] };
    const first = await h.call('POST', '/v1/push', adminToken, batch);
    expect(first.json).toMatchObject({ inserted: 2, unchanged: 0 });
    const again = await h.call('POST', '/v1/push', b.token, batch);
    expect(again.json).toMatchObject({ inserted: 0, replaced: 0, unchanged: 2, seq: first.json.seq });

    const later = (iso: string, ms: number) => new Date(Date.parse(iso) + ms).toISOString();
    // B's copies carry B's writer id and no base (a device that never saw the stored version).
    const writerB = DEMO.devices[1]!.id;
    const newer = { ...one!, deviceId: writerB, updatedAt: later(one!.updatedAt, 60_000), value: { kind: 'angle', angleDeg: -11 } };
    const older = { ...one!, updatedAt: later(one!.updatedAt, 30_000), value: { kind: 'angle', angleDeg: -99 } };
    const tomb = { ...two!, deviceId: writerB, updatedAt: later(two!.updatedAt, 1000), deleted: true };
    expect((await h.call('POST', '/v1/push', b.token, { records: [{ table: 'observations', record: newer }, { table: 'observations', record: tomb }] })).json).toMatchObject({ replaced: 2 });
    const stale = await h.call('POST', '/v1/push', adminToken, { records: [{ table: 'observations', record: older }] });
    expect(stale.json).toMatchObject({ keptStored: 1, conflicts: [{ recordId: one!.id, winner: 'stored', reason: 'newer' }] });
    await h.call('POST', '/v1/push', adminToken, { records: [{ table: 'observations', record: older }] });

    const pulled = (await h.call('GET', '/v1/pull?cursor=0', adminToken)).json.records as { record: { id: string; deleted: boolean; value: unknown } }[];
    expect(pulled.find((r) => r.record.id === one!.id)!.record.value).toEqual({ kind: 'angle', angleDeg: -11 });
    expect(pulled.find((r) => r.record.id === two!.id)!.record.deleted).toBe(true);
    const conflicts = (await h.call('GET', '/v1/conflicts', b.token)).json.conflicts as { recordId: string; winner: string }[];
    // two replacements (newer incoming) and one stale copy kept out, the repeated stale push not again
    expect(conflicts.map((c) => `${c.recordId === one!.id ? 'one' : 'two'}:${c.winner}`).sort()).toEqual(['one:incoming', 'one:stored', 'two:incoming']);

    // The same version again (same updatedAt, same writing device) with other text, as when a device
    // pushes back what it pulled and seals it anew: unchanged, and no conflict.
    const conflictsBefore = ((await h.call('GET', '/v1/conflicts', b.token)).json.conflicts as unknown[]).length;
    const resealed = await h.call('POST', '/v1/push', b.token, { records: [{ table: 'observations', record: { ...newer, value: { kind: 'angle', angleDeg: -12 } } }] });
    expect(resealed.json).toMatchObject({ unchanged: 1, replaced: 0, keptStored: 0, conflicts: [] });
    expect(((await h.call('GET', '/v1/conflicts', b.token)).json.conflicts as unknown[]).length).toBe(conflictsBefore);

    // Tie: same updatedAt from two devices, different content: the larger canonical text wins whichever
    // arrives first (here B's device id sorts after A's, and "deviceId" comes before "value" in it).
    const [lowDevice, highDevice] = DEMO.devices.map((d) => d.id).sort();
    const tieA = { ...one!, deviceId: lowDevice!, updatedAt: later(one!.updatedAt, 90_000), value: { kind: 'angle', angleDeg: -20 } };
    const tieB = { ...tieA, deviceId: highDevice!, value: { kind: 'angle', angleDeg: -30 } };
    await h.call('POST', '/v1/push', adminToken, { records: [{ table: 'observations', record: tieB }] });
    await h.call('POST', '/v1/push', b.token, { records: [{ table: 'observations', record: tieA }] });
    const final = (await h.call('GET', '/v1/pull?cursor=0', adminToken)).json.records as { record: { id: string; value: unknown } }[];
    expect(final.find((r) => r.record.id === one!.id)!.record.value).toEqual({ kind: 'angle', angleDeg: -30 });
  });

  it('a push with its base: an edit of the stored version is no conflict; an edit of an older version is, listed once', async () => {
    const { adminToken } = await teamWithAdmin(h, 'Base team');
    const b = await enrolDevice(h, adminToken, 'clinician');
    const [writerA, writerB] = DEMO.devices.map((d) => d.id);
    const [one] = simulatedObservations(1, 3, writerA!);
    const at = (ms: number) => new Date(Date.parse(one!.updatedAt) + ms).toISOString();
    const push = (token: string, record: unknown, base: string | null) => h.call('POST', '/v1/push', token, { records: [{ table: 'observations', record, base }] });
    expect((await push(adminToken, one, null)).json).toMatchObject({ inserted: 1 });
    // B pulled `one` and edits it: its base is the stored version.
    const editB = { ...one!, deviceId: writerB!, updatedAt: at(60_000), value: { kind: 'angle', angleDeg: -11 } };
    expect((await push(b.token, editB, one!.updatedAt)).json).toMatchObject({ replaced: 1, conflicts: [] });
    // A edited its own first version without seeing B's: stored ≠ base, a real conflict (A's is newer, so it wins).
    const editA = { ...one!, updatedAt: at(90_000), value: { kind: 'angle', angleDeg: -12 } };
    expect((await push(adminToken, editA, one!.updatedAt)).json).toMatchObject({ replaced: 1, conflicts: [{ recordId: one!.id, winner: 'incoming', reason: 'newer' }] });
    // B pulls A's and edits it: ordinary again. A device without bases (base null) that edits a
    // teammate's version is listed, as before.
    const editB2 = { ...editA, deviceId: writerB!, updatedAt: at(120_000), value: { kind: 'angle', angleDeg: -13 } };
    expect((await push(b.token, editB2, editA.updatedAt)).json).toMatchObject({ replaced: 1, conflicts: [] });
    const noBase = { ...editB2, deviceId: writerA!, updatedAt: at(150_000), value: { kind: 'angle', angleDeg: -14 } };
    expect((await push(adminToken, noBase, null)).json).toMatchObject({ replaced: 1, conflicts: [{ winner: 'incoming' }] });
    // The same writer's later version (a retry after a lost reply, whose base was not yet moved): no conflict.
    const retryA = { ...noBase, updatedAt: at(160_000), value: { kind: 'angle', angleDeg: -15 } };
    expect((await push(adminToken, retryA, editB2.updatedAt)).json).toMatchObject({ replaced: 1, conflicts: [] });
    const bad = await h.call('POST', '/v1/push', adminToken, { records: [{ table: 'observations', record: { ...retryA, updatedAt: at(170_000) }, base: 'yesterday' }] });
    expect(bad.status).toBe(400);
    expect(bad.json.error).toMatch(/records\[0\].*base: must be null or the ISO updatedAt/);
    const listed = (await h.call('GET', '/v1/conflicts', b.token)).json.conflicts as { recordId: string }[];
    expect(listed.length).toBe(2);
  });

  it('concurrent editors with bases: only the record two devices edited from the same base is a conflict, once', async () => {
    const { adminToken } = await teamWithAdmin(h, 'Editors team');
    const devices = await Promise.all(Array.from({ length: 5 }, () => enrolDevice(h, adminToken, 'clinician')));
    // A writer id for the first author and one for each device (the record's deviceId is its last writer).
    const writers = simulatedObservations(6, 77, DEMO.devices[0]!.id).map((o) => o.id);
    const originals = simulatedObservations(40, 21, writers[5]!);
    await h.call('POST', '/v1/push', adminToken, { records: originals.map((record) => ({ table: 'observations', record, base: null })) });
    const shared = originals[0]!;
    // Each device edits 8 records of its own and, all at once, the shared one, each from its base.
    const results = await Promise.all(
      devices.map(async (d, i) => {
        const own = originals.slice(1 + i * 7, 8 + i * 7);
        const edits = [shared, ...own].map((o, k) => ({
          table: 'observations',
          base: o.updatedAt,
          record: { ...o, deviceId: writers[i]!, updatedAt: new Date(Date.parse(o.updatedAt) + 1000 * (i + 1) + k).toISOString(), value: { kind: 'angle', angleDeg: -20 - i } },
        }));
        const res = await h.call('POST', '/v1/push', d.token, { records: edits });
        expect(res.status, JSON.stringify(res.json)).toBe(200);
        return res.json as { replaced: number; keptStored: number; conflicts: { recordId: string }[] };
      }),
    );
    // The first pusher's edit of the shared record is ordinary; each later one finds another version
    // than its base: 4 conflicts, all about the shared record, none about the others.
    const conflicts = results.flatMap((r) => r.conflicts);
    expect(conflicts.length).toBe(devices.length - 1);
    expect(conflicts.every((c) => c.recordId === shared.id)).toBe(true);
    const stored = (await h.call('GET', '/v1/pull?cursor=0&limit=2000', adminToken)).json.records as { record: { id: string; updatedAt: string } }[];
    // Newer wins on the shared record whatever the order: the last device's stamp is the latest.
    const latest = new Date(Date.parse(shared.updatedAt) + 1000 * devices.length).toISOString();
    expect(stored.find((r) => r.record.id === shared.id)!.record.updatedAt).toBe(latest);
  });

  it('teams are apart, and an auditor device gets no identities and no notes and may not push', async () => {
    const a = await teamWithAdmin(h, 'Team one');
    const other = await teamWithAdmin(h, 'Team two');
    const auditor = await enrolDevice(h, a.adminToken, 'auditor');
    const assessment = DEMO.assessments.find((x) => x.notes !== null)!;
    const identity = DEMO.identities[0]!;
    const { notes: _n, ...assessmentRest } = assessment;
    const { familyName: _f, givenName: _g, dateOfBirth: _d, contact: _c, ...identityRest } = identity;
    const sealed = { iv: 'AAAAAAAAAAAAAAAA', ct: 'c2VhbGVkIHRleHQ=' };
    const pushed = await h.call('POST', '/v1/push', a.adminToken, {
      records: [
        { table: 'identities', record: { ...identityRest, sealed } },
        { table: 'assessments', record: { ...assessmentRest, notesSealed: sealed } },
      ],
    });
    expect(pushed.status).toBe(200);
    const full = (await h.call('GET', '/v1/pull?cursor=0', a.adminToken)).json.records as { table: string; record: Record<string, unknown> }[];
    expect(full.map((r) => r.table).sort()).toEqual(['assessments', 'identities']);
    const seen = (await h.call('GET', '/v1/pull?cursor=0', auditor.token)).json.records as { table: string; record: Record<string, unknown> }[];
    expect(seen.map((r) => r.table)).toEqual(['assessments']);
    expect(seen[0]!.record.notesSealed).toBeNull();
    expect((await h.call('POST', '/v1/push', auditor.token, { records: [] })).status).toBe(403);
    expect((await h.call('GET', '/v1/pull?cursor=0', other.adminToken)).json.records).toEqual([]);
    expect((await h.call('POST', `/v1/devices/${auditor.deviceId}/revoke`, other.adminToken)).status).toBe(404);
  });

  it('concurrent pushers: a puller paging by change number never skips a change, and ends with every record once', async () => {
    const { adminToken } = await teamWithAdmin(h, 'Busy team');
    const pushers = await Promise.all(Array.from({ length: 6 }, () => enrolDevice(h, adminToken, 'clinician')));
    const perPusher = 120;
    const batches = pushers.map((p, i) => {
      const obs = simulatedObservations(perPusher, 100 + i, DEMO.devices[0]!.id);
      return { token: p.token, batches: Array.from({ length: perPusher / 10 }, (_, k) => obs.slice(k * 10, k * 10 + 10)) };
    });
    const seen = new Map<string, number>();
    let cursor = 0;
    let done = false;
    const puller = (async () => {
      for (;;) {
        const finished = done;
        const page = await h.call('GET', `/v1/pull?cursor=${cursor}&limit=7`, adminToken);
        expect(page.status, JSON.stringify(page.json)).toBe(200);
        for (const r of page.json.records as { seq: number; record: { id: string } }[]) {
          expect(r.seq).toBeGreaterThan(cursor);
          seen.set(r.record.id, (seen.get(r.record.id) ?? 0) + 1);
        }
        cursor = page.json.cursor as number;
        if (finished && page.json.more === false) return;
      }
    })();
    try {
      await Promise.all(
        batches.map(async ({ token, batches: list }) => {
          for (const records of list) {
            const res = await h.call('POST', '/v1/push', token, { records: records.map((record) => ({ table: 'observations', record })) });
            // Without the counter lock two pushers take the same change numbers: PostgreSQL refuses the
            // second (unique team/seq index) and this is a 500 (negative control in DEVELOPERS.md).
            expect(res.status, JSON.stringify(res.json)).toBe(200);
          }
        }),
      );
    } finally {
      // Let the puller finish its last pages even when a push failed, so nothing runs on after the test.
      done = true;
      await puller;
    }
    // Each record was written once, so an incremental puller must have seen each exactly once.
    expect(seen.size).toBe(pushers.length * perPusher);
    expect([...seen.values()].every((n) => n === 1)).toBe(true);
  });
});
