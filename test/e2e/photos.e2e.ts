// Exercise photos in the browser: the therapist picks picture files for an exercise of the demo
// programme (one large, noisy PNG drawn here with a canvas, so the encoder must step down; bad
// files refused by name), each is kept as WebP of at most 150,000 bytes and 1024 px, goes in the
// hand-off file (the QR codes say they carry text only), and the patient's phone shows it large.
import { beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Download, Page } from 'playwright-core';
import { setUpDevice, tableRows } from './app-helpers';
import { newAppContext, reflowProblems, screenshot, seriousAxeViolations, setTextScale, smallPhone, tablet, waitForOfflineWorker, waitForSettledPage } from './harness';
import { sharedChromium } from '../support/shared-browser';

const work = join('test-output', 'photos-e2e');
/** The programme file (with photos) and its code, handed over by the first test, received in Spanish by the second. */
let handedOver: { file: string; code: string } | null = null;
const chromium = sharedChromium();
beforeAll(async () => {
  mkdirSync(work, { recursive: true });
});

/**
 * A picture file drawn in the page: sky-to-floor gradient, a few shapes, and seeded per-pixel
 * noise (a camera's grain), so it compresses badly, as a real photo does. Returns a file path.
 */
async function drawPicture(page: Page, name: string, widthPx: number, heightPx: number, type: 'image/png' | 'image/jpeg'): Promise<string> {
  const dataUrl = await page.evaluate(
    ({ w, h, type }) => {
      const canvas = document.createElement('canvas');
      canvas.width = w;
      canvas.height = h;
      const g = canvas.getContext('2d')!;
      const sky = g.createLinearGradient(0, 0, 0, h);
      sky.addColorStop(0, '#8ab4d8');
      sky.addColorStop(0.6, '#e8dcc4');
      sky.addColorStop(1, '#7a5a3a');
      g.fillStyle = sky;
      g.fillRect(0, 0, w, h);
      g.fillStyle = '#3a6b35';
      g.beginPath();
      g.arc(w * 0.4, h * 0.45, h * 0.2, 0, 2 * Math.PI);
      g.fill();
      g.fillStyle = '#c0392b';
      g.fillRect(w * 0.55, h * 0.3, w * 0.1, h * 0.5);
      const pixels = g.getImageData(0, 0, w, h);
      let seed = 12345;
      for (let i = 0; i < pixels.data.length; i += 4) {
        seed = (seed * 1103515245 + 12345) >>> 0;
        const grain = ((seed >>> 16) % 61) - 30;
        pixels.data[i] = Math.min(255, Math.max(0, pixels.data[i]! + grain));
        pixels.data[i + 1] = Math.min(255, Math.max(0, pixels.data[i + 1]! + grain));
        pixels.data[i + 2] = Math.min(255, Math.max(0, pixels.data[i + 2]! + grain));
      }
      g.putImageData(pixels, 0, 0);
      return canvas.toDataURL(type, 0.95);
    },
    { w: widthPx, h: heightPx, type },
  );
  const path = join(work, name);
  writeFileSync(path, Buffer.from(dataUrl.split(',')[1]!, 'base64'));
  return path;
}

async function savedDownload(page: Page, click: () => Promise<void>, name: string): Promise<string> {
  const [download] = (await Promise.all([page.waitForEvent('download'), click()])) as [Download, void];
  const path = join(work, name);
  await download.saveAs(path);
  return path;
}

interface PhotoRow {
  programmeId: string;
  exercise: number;
  position: number;
  type: string;
  widthPx: number;
  heightPx: number;
  bytes: Uint8Array | Record<string, number>;
}
const byteLength = (b: PhotoRow['bytes']) => (b instanceof Uint8Array ? b.length : Object.keys(b).length);
const firstBytes = (b: PhotoRow['bytes'], n: number) => Array.from({ length: n }, (_, i) => (b as Record<number, number>)[i]!);

describe('exercise photos, offline, from the therapist tablet to the patient phone', () => {
  it('shrinks picked pictures to WebP ≤ 150 KB, refuses bad files by name, hands them over in the file and shows them large on the phone', async () => {
    const therapistContext = await newAppContext(chromium.browser, { viewport: tablet });
    const t = await therapistContext.newPage();
    await t.goto('/');
    await waitForOfflineWorker(t);
    await therapistContext.setOffline(true);
    await setUpDevice(t, { demo: true });

    // A demo patient with a saved programme (the demo gives one to some patients).
    const [demoProgramme] = await tableRows<{ id: string; patientId: string }>(t, 'homeProgrammes');
    expect(demoProgramme, 'a demo patient with a programme').toBeDefined();
    await t.goto(`/patients/${demoProgramme!.patientId}/programme`);
    await t.getByRole('heading', { name: 'The programme' }).waitFor();

    const big = await drawPicture(t, 'big-grainy.png', 2400, 1800, 'image/png');
    const small = await drawPicture(t, 'small.jpg', 640, 480, 'image/jpeg');
    expect(readFileSync(big).length, 'the test picture is far above the limit').toBeGreaterThan(1_000_000);
    const notAPicture = join(work, 'notes.txt');
    writeFileSync(notAPicture, 'calf stretch: 3 × 30 s');
    const fakePicture = join(work, 'holiday.png');
    writeFileSync(fakePicture, 'this is not really a PNG');

    const first = t.getByRole('group', { name: 'Exercise 1' });
    const photosOfDemo = async () => (await tableRows<PhotoRow>(t, 'exercisePhotos')).filter((r) => r.programmeId === demoProgramme!.id);
    // The demo programme comes with an invented drawing of its calf stretch, painted and encoded
    // as WebP when the demo was loaded, so the hand-over with a photo can be shown from the demo.
    await first.getByText('Photos (1 of 2)').waitFor();
    const [drawn] = await photosOfDemo();
    expect([drawn!.exercise, drawn!.position, drawn!.type]).toEqual([0, 1, 'image/webp']);
    expect(byteLength(drawn!.bytes)).toBeLessThanOrEqual(150_000);
    await t.getByRole('button', { name: 'Prepare the hand-over' }).click();
    await t.getByTestId('handover-photos').getByText(/The file carries 1 photo \(/).waitFor();
    mkdirSync(join('test-output', 'screenshots'), { recursive: true });
    await first.locator('img').first().screenshot({ path: join('test-output', 'screenshots', 'demo-drawing.png') });
    // Room for the therapist's own photos.
    await first.getByRole('button', { name: 'Remove photo 1' }).click();
    await first.getByText('Photos (0 of 2)').waitFor();
    // Bad files: a clear error naming the file, nothing kept.
    await t.locator('#photo-0-file').setInputFiles(notAPicture);
    await first.getByText(/"notes\.txt" is not a picture \(it is text\/plain\)/).waitFor();
    await t.locator('#photo-0-file').setInputFiles(fakePicture);
    await first.getByText(/"holiday\.png" could not be read as a picture/).waitFor({ timeout: 20_000 });
    expect(await photosOfDemo()).toEqual([]);

    // Two good pictures at once; the camera input is there for the tablet's camera.
    expect(await t.locator('#photo-0-camera').getAttribute('capture')).toBe('environment');
    expect(await t.locator('#photo-0-camera').getAttribute('accept')).toBe('image/*');
    await t.locator('#photo-0-file').setInputFiles([big, small]);
    await first.getByText('Photos (2 of 2)').waitFor({ timeout: 60_000 });
    const rows = await photosOfDemo();
    expect(rows.map((r) => [r.exercise, r.position, r.type])).toEqual([
      [0, 1, 'image/webp'],
      [0, 2, 'image/webp'],
    ]);
    for (const r of rows) {
      expect(byteLength(r.bytes), 'stored size').toBeLessThanOrEqual(150_000);
      expect(Math.max(r.widthPx, r.heightPx)).toBeLessThanOrEqual(1024);
      // RIFF....WEBP (RFC 9649): really WebP, not a PNG fallback.
      expect(String.fromCharCode(...firstBytes(r.bytes, 12)).replace(/^RIFF....WEBP$/s, 'ok')).toBe('ok');
    }
    // The big one kept its shape (4:3) and was made smaller; the small one kept its size.
    const [bigRow, smallRow] = rows as [PhotoRow, PhotoRow];
    expect(bigRow.widthPx / bigRow.heightPx).toBeCloseTo(4 / 3, 2);
    expect([smallRow.widthPx, smallRow.heightPx]).toEqual([640, 480]);
    // No more than two per exercise: the pickers are gone.
    expect(await t.locator('#photo-0-file').count()).toBe(0);
    // The programme record itself carries no photo (the audit copies records on every change).
    const programmes = await tableRows<{ items: unknown }>(t, 'homeProgrammes');
    expect(JSON.stringify(programmes)).not.toMatch(/RIFF|webp/i);
    await waitForSettledPage(t, 'the therapist programme page');
    expect(await seriousAxeViolations(t)).toEqual([]);
    await screenshot(t, 'photos-therapist-1024');

    // The patient's language is chosen at hand-over: English is the default.
    const languages = t.getByRole('group', { name: "The patient's language" });
    expect(await languages.getByRole('radio', { name: 'English' }).isChecked()).toBe(true);
    await t.getByRole('button', { name: 'Prepare the hand-over' }).click();
    const code = (await t.getByTestId('handover-code').textContent())!.trim();
    await t.getByTestId('handover-photos').getByText(/The file carries 2 photos/).waitFor();
    await t.getByTestId('handover-language').getByText('The phone will open in English.').waitFor();
    const file = await savedDownload(t, () => t.getByRole('button', { name: 'Share or save the file' }).click(), 'programme-with-photos.json');
    await t.getByRole('button', { name: 'Show as QR codes' }).click();
    await t.getByTestId('qr-text-only').getByText(/QR codes carry the programme's text only, never photos/).waitFor();
    // A second hand-over in Spanish, for the Spanish-speaking patient of the next test. Choosing
    // another language drops the prepared file (it would open in the old language).
    await languages.getByRole('radio', { name: 'Español' }).check();
    await expect.poll(() => t.getByTestId('handover-code').count()).toBe(0);
    await t.getByRole('button', { name: 'Prepare the hand-over' }).click();
    await t.getByTestId('handover-language').getByText('The phone will open in Español.').waitFor();
    const spanishCode = (await t.getByTestId('handover-code').textContent())!.trim();
    handedOver = { file: await savedDownload(t, () => t.getByRole('button', { name: 'Share or save the file' }).click(), 'programme-in-spanish.json'), code: spanishCode };
    // The hand-over card on a 360 px screen with 200 % text.
    await t.setViewportSize(smallPhone);
    await setTextScale(t, 2);
    await waitForSettledPage(t, 'the hand-over at 360 px and 200 % text');
    expect((await reflowProblems(t)).join('\n'), 'hand-over at 360 px with 200 % text').toBe('');
    expect(await seriousAxeViolations(t)).toEqual([]);
    mkdirSync(join('test-output', 'screenshots'), { recursive: true });
    await t.getByRole('button', { name: 'Hide QR codes' }).click();
    await t.getByRole('group', { name: "The patient's language" }).scrollIntoViewIfNeeded();
    await t.screenshot({ path: join('test-output', 'screenshots', 'handover-language-360-200.png') });
    await setTextScale(t, 1);
    await t.setViewportSize(tablet);

    // The patient's phone, 360 px wide, offline.
    const phoneContext = await newAppContext(chromium.browser, { viewport: smallPhone });
    const p = await phoneContext.newPage();
    await p.goto('/');
    await waitForOfflineWorker(p);
    await phoneContext.setOffline(true);
    await p.reload();
    await p.getByRole('button', { name: 'Receive my programme' }).click();
    await p.locator('#programme-file').setInputFiles(file);
    await p.getByLabel('Code from your therapist').fill(code);
    await p.getByRole('button', { name: 'Open my programme' }).click();
    await p.getByText(/is on this phone/).waitFor({ timeout: 30_000 });
    const phoneRows = (await tableRows<PhotoRow>(p, 'exercisePhotos')).filter((r) => r.programmeId === demoProgramme!.id);
    expect(phoneRows.map((r) => [r.exercise, r.position, byteLength(r.bytes)])).toEqual(rows.map((r) => [r.exercise, r.position, byteLength(r.bytes)]));

    await p.getByRole('link', { name: "Go to today's exercises" }).click();
    const pictures = p.getByTestId('exercise-photos').first().locator('img');
    await pictures.nth(1).waitFor();
    await p.waitForFunction(() => Array.from(document.querySelectorAll<HTMLImageElement>('[data-testid="exercise-photos"] img')).every((i) => i.complete && i.naturalWidth > 0));
    // Shown large: nearly the card's full width on a 360 px phone.
    const shown = await pictures.first().boundingBox();
    expect(shown!.width).toBeGreaterThan(280);
    expect(await pictures.first().getAttribute('alt')).toMatch(/^Photo 1 of 2: /);
    await waitForSettledPage(p, 'the patient today screen');
    expect(await seriousAxeViolations(p)).toEqual([]);
    await screenshot(p, 'photos-phone-360');
    await p.setViewportSize(tablet);
    await waitForSettledPage(p, 'the patient today screen at 1024 px');
    await screenshot(p, 'photos-phone-1024');

    await phoneContext.close();
    await therapistContext.close();
  }, 240_000);

  it('speaks Spanish on every patient screen, chosen on the phone or by the therapist at hand-over: lang="es", no English left, axe clean, reflows at 200 % text', async () => {
    expect(handedOver, 'the first test handed a programme over').not.toBeNull();
    const context = await newAppContext(chromium.browser, { viewport: smallPhone });
    const p = await context.newPage();
    await p.goto('/');
    await waitForOfflineWorker(p);
    await context.setOffline(true);
    await p.reload();

    /**
     * Visible text of the page that is in the interface's own words: text the therapist wrote
     * (programme title, exercise names, notes) and parts marked English on purpose (the
     * therapist's card on the first screen) are left out.
     */
    const interfaceText = () =>
      p.evaluate(() => {
        const out: string[] = [];
        const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
        for (let node = walker.nextNode(); node; node = walker.nextNode()) {
          const el = node.parentElement;
          if (!el || el.closest('[data-written-by-therapist], [lang="en"], script, style')) continue;
          if (!el.checkVisibility()) continue;
          const text = node.textContent?.trim();
          if (text) out.push(text);
        }
        for (const el of document.querySelectorAll<HTMLElement>('[aria-label], [alt], [placeholder]')) {
          if (el.closest('[data-written-by-therapist], [lang="en"]') || !el.checkVisibility()) continue;
          for (const a of ['aria-label', 'alt', 'placeholder']) if (el.getAttribute(a)) out.push(el.getAttribute(a)!);
        }
        return out.join(' | ');
      });
    // Common English words of the patient screens; none is a Spanish word.
    const english = /\b(the|your|you|and|of|to|is|are|this|with|for|today|week|done|skipped|partly|reminders?|programme|phone|times?|repetitions?|hold|sets?|save|send|report|open|get|my|every|days?|exercises?|photos?|nothing|older|remove|keep|stop|how|what|will|not|skip|content)\b/i;
    async function checkScreen(name: string): Promise<void> {
      await waitForSettledPage(p, `the Spanish ${name} screen`);
      expect(await p.evaluate(() => document.documentElement.lang), name).toBe('es');
      const text = await interfaceText();
      expect(text.match(english)?.[0] ?? null, `English left on the Spanish ${name} screen: ${text}`).toBeNull();
      expect(await seriousAxeViolations(p), name).toEqual([]);
      await setTextScale(p, 2);
      await waitForSettledPage(p, `the Spanish ${name} screen at 200 % text`);
      expect((await reflowProblems(p)).join('\n'), `${name} at 360 px with 200 % text`).toBe('');
      await screenshot(p, `patient-es-${name}`);
      await setTextScale(p, 1);
    }

    // First screen: the language choice is there before anything else.
    await p.getByRole('button', { name: 'Español' }).click();
    await p.getByRole('heading', { name: 'Sigo un programa en casa' }).waitFor();
    await checkScreen('first');
    await p.getByRole('button', { name: 'Recibir mi programa' }).click();
    await p.getByRole('heading', { name: 'Recibir mi programa' }).waitFor();
    await checkScreen('receive');
    // The phone is switched back to English: the therapist's choice in the file (Español) must
    // then be what opens the patient's screens in Spanish.
    await p.getByRole('button', { name: 'English' }).click();
    await p.getByRole('heading', { name: 'Get my programme' }).waitFor();
    expect(await p.evaluate(() => document.documentElement.lang)).toBe('en');
    await p.locator('#programme-file').setInputFiles(handedOver!.file);
    await p.getByLabel('Code from your therapist').fill(handedOver!.code);
    await p.getByRole('button', { name: 'Open my programme' }).click();
    await p.getByText(/ya está en este teléfono/).waitFor({ timeout: 30_000 });
    expect(await p.evaluate(() => document.documentElement.lang)).toBe('es');
    expect(await p.getByRole('button', { name: 'Español' }).getAttribute('aria-pressed')).toBe('true');

    const menu = p.getByRole('navigation', { name: 'Main' });
    await menu.getByRole('link', { name: 'Hoy' }).click();
    await p.getByRole('heading', { name: 'Hoy', level: 1 }).waitFor();
    // Dose lines worded in Spanish from the structured dose (demo: hold 30 s, 3 repetitions, 5 days a week).
    await p.getByText('Mantener 30 s · 3 repeticiones · 5 días a la semana', { exact: true }).waitFor();
    await p.getByText('Durante la noche', { exact: true }).waitFor();
    await p.getByTestId('exercise-photos').first().locator('img').first().waitFor();
    await p.getByRole('radio', { name: '✓ Hecho' }).first().check();
    await p.getByText('Guardado.').waitFor();
    await p.getByRole('radio', { name: '✗ No lo hice' }).nth(1).check();
    await p.getByRole('button', { name: 'Dolor' }).click();
    await checkScreen('today');
    await menu.getByRole('link', { name: 'Mi semana' }).click();
    await p.getByRole('heading', { name: 'Semana a semana' }).waitFor();
    await checkScreen('week');
    await menu.getByRole('link', { name: 'Cómo me siento' }).click();
    await p.getByRole('heading', { name: '¿Cómo están hoy tus espasmos?' }).waitFor();
    await checkScreen('feel');
    await menu.getByRole('link', { name: 'Enviar informe' }).click();
    await p.getByRole('button', { name: 'Preparar mi informe' }).click();
    await p.getByTestId('report-code').waitFor({ timeout: 30_000 });
    await checkScreen('send');
    await menu.getByRole('link', { name: 'Avisos' }).click();
    await p.getByText('Lo que no hará:').waitFor();
    await checkScreen('reminders');
    await p.getByRole('link', { name: 'Dejar de usar este teléfono para mi programa' }).click();
    await p.getByTestId('to-remove').getByText('las fotos de los ejercicios: 2').waitFor();
    await checkScreen('leave');

    // Back to English on the phone: the same screen in English, lang="en".
    await p.getByRole('button', { name: 'English' }).click();
    await p.getByRole('heading', { name: 'Stop using this phone for my programme' }).waitFor();
    expect(await p.evaluate(() => document.documentElement.lang)).toBe('en');
    await context.close();
  }, 240_000);
});
