import { describe, expect, it } from 'vitest';
import { loadDemoCaseload } from '../../../src/lib/store/demo-caseload';
import { photosOfProgramme } from '../../../src/lib/store';
import { DEMO_DRAWN_EXERCISE, calfStretchDrawing, type LineDrawing } from '../../../src/lib/demo';
import { dumpAll, freshStore, steppingClock } from '../store/store-helpers';

describe('loadDemoCaseload', () => {
  it('loads the demo through the ordinary import; loading again changes nothing', async () => {
    // The demo runs to 2025-06-30: a store whose clock is later takes it (an earlier one would refuse its future stamps).
    const store = await freshStore({ now: steppingClock(Date.UTC(2025, 6, 1)) });
    const report = await loadDemoCaseload(store, { seed: 3 });
    expect(report.counts.patients.inserted).toBe(12);
    const patients = await store.patients.list();
    expect(patients).toHaveLength(12);
    const identity = await store.identities.forPatient(patients[0]!.id);
    expect(identity!.contact).toMatch(/Invented demo person/);
    const series = await store.observations.series(patients[0]!.id, 'mas');
    expect(series.length).toBeGreaterThan(0);
    const snapshot = await dumpAll(store);
    expect((await loadDemoCaseload(store, { seed: 3 })).changed).toBe(false);
    expect(await dumpAll(store)).toEqual(snapshot);
    store.close();
  });

  it('with a painter (the page\'s canvas), gives each demo programme\'s calf stretch its drawing as photo 1; without one, no photos', async () => {
    const painted: LineDrawing[] = [];
    // A stand-in painter: a RIFF/WEBP header (RFC 9649 §2.5) with filler; the real one paints on a canvas (browser test photos.e2e.ts).
    const webp = Uint8Array.from([82, 73, 70, 70, 24, 0, 0, 0, 87, 69, 66, 80, 86, 80, 56, 32, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1]);
    const paint = async (drawing: LineDrawing) => (painted.push(drawing), { type: 'image/webp' as const, widthPx: drawing.widthPx, heightPx: drawing.heightPx, bytes: webp });
    const store = await freshStore({ now: steppingClock(Date.UTC(2025, 6, 1)) });
    const report = await loadDemoCaseload(store, { seed: 3 }, paint);
    expect(painted).toEqual([calfStretchDrawing()]);
    const programmes = await store.homeProgrammes.list();
    expect(programmes.length).toBeGreaterThan(0);
    let withStretch = 0;
    for (const programme of programmes) {
      const at = programme.items.findIndex((item) => item.name === DEMO_DRAWN_EXERCISE);
      const photos = await photosOfProgramme(store, programme.id);
      expect(photos.map((p) => [p.exercise, p.position, p.widthPx, p.heightPx])).toEqual(at >= 0 ? [[at, 1, 800, 600]] : []);
      if (at >= 0) withStretch++;
    }
    expect(withStretch).toBeGreaterThan(0);
    expect(report.photos.written).toBe(withStretch);
    // Loading again changes nothing.
    expect((await loadDemoCaseload(store, { seed: 3 }, paint)).changed).toBe(false);
    const plain = await freshStore({ now: steppingClock(Date.UTC(2025, 6, 1)) });
    await loadDemoCaseload(plain, { seed: 3 });
    expect(await plain.db.table('exercisePhotos').count()).toBe(0);
  });
});
