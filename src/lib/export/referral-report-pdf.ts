// The referral report as a PDF file, made on the device (no network, no print dialogue), so that it
// can go through the share sheet or be downloaded. Library: pdf-lib 1.17.1 (MIT; pure JavaScript, runs
// unchanged in Node for the tests and in the page; standard fonts, vector drawing, real text). It is
// about 200 KB gzip, so this module is imported by its own path and only when the person asks for the
// PDF (never through the export folder's index, which the first screen reaches).
import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage, type RGB } from 'pdf-lib';
import { pdfSafeText } from './pdf-safe-text';
import type { ReferralReport, ReportMeasure } from './referral-report';
import { REPORT_CHART_AXIS_PX, REPORT_CHART_BOX, reportChartGeometry } from './report-chart-geometry';
import {
  interventionDetails,
  NO_INTERVENTIONS_TEXT,
  NO_VISITS_TEXT,
  notRemeasuredText,
  REPORT_CHART_LEGEND,
  REPORT_COLUMNS,
  REPORT_HEADINGS,
  REPORT_TITLE,
  reportDayFormatter,
  reportFooterText,
  reportPdfFileName,
  reportPreparedLines,
  reportScopeParts,
  reportVisitLines,
  reportWeekFormatter,
  reportWhoParts,
  weekShareText,
  type TextPart,
} from './report-wording';

export interface ReferralReportPdfOptions {
  /** Locale of the written days (the page's own); undefined: the runtime's default. */
  readonly locale?: string;
  /** When the file is made (ms since 1970, UTC), for the document's creation date; the caller reads the clock. */
  readonly createdAtMs: number;
}

export interface ReferralReportPdf {
  readonly bytes: Uint8Array;
  readonly pageCount: number;
  /** "kinnote-report-<code>-<day>.pdf": code and day, never the name. */
  readonly fileName: string;
  /** Characters the standard fonts cannot write that were simplified, as "Ł→L" (see pdfSafeText). */
  readonly simplified: readonly string[];
}

// A4 is 210 × 297 mm (ISO 216); 1 pt = 1/72 in = 25.4/72 mm.
const mm = (value: number) => (value * 72) / 25.4;
const PAGE_WIDTH = mm(210);
const PAGE_HEIGHT = mm(297);
// The print styles' margins: 14 mm top and bottom, 13 mm at the sides.
const MARGIN_X = mm(13);
const MARGIN_TOP = mm(14);
const MARGIN_BOTTOM = mm(14);
const FOOTER_PT = 12;
const CONTENT_WIDTH = PAGE_WIDTH - 2 * MARGIN_X;
const CONTENT_BOTTOM = PAGE_HEIGHT - MARGIN_BOTTOM - FOOTER_PT;

const hex = (value: string): RGB => rgb(parseInt(value.slice(1, 3), 16) / 255, parseInt(value.slice(3, 5), 16) / 255, parseInt(value.slice(5, 7), 16) / 255);
// The theme's colours (src/lib/ui/theme.css) and the page's report colours.
const INK = hex('#111111');
const MUTED = hex('#3d4a50');
const RULE = hex('#9aa5a8');
const LIGHT_RULE = hex('#c9cfd0');
const BRAND = hex('#1f4e5a');
const ACCENT = hex('#f2c14e');
const GOOD = hex('#1d6b45');
const BAD = hex('#a3261b');
const BAND = hex('#dde8e6');
const EVENT = hex('#7a5a00');
const WHITE = rgb(1, 1, 1);

const BODY_PT = 9;
const SMALL_PT = 7.5;
const LINE = 1.3;
const CELL_PAD = 3;

// Table columns in points: measure, baseline, latest, change, MDC; the chart takes the rest.
const COLUMN_WIDTHS = [140, 62, 62, 68, 74] as const;
const TEXT_COLUMNS_WIDTH = COLUMN_WIDTHS.reduce((a, b) => a + b, 0);
const CHART_WIDTH = Math.min(mm(36), CONTENT_WIDTH - TEXT_COLUMNS_WIDTH - 4);
const CHART_SCALE = CHART_WIDTH / (REPORT_CHART_BOX.widthPx + REPORT_CHART_AXIS_PX);
const CHART_HEIGHT = REPORT_CHART_BOX.heightPx * CHART_SCALE;

interface Fonts {
  readonly regular: PDFFont;
  readonly bold: PDFFont;
  readonly code: PDFFont;
}

interface Run {
  readonly text: string;
  readonly font: PDFFont;
}
type Line = readonly Run[];

interface Style {
  readonly size: number;
  readonly color?: RGB;
}

/** Lays text out top-down on A4 pages; `y` is the distance from the top of the current page. */
class Sheet {
  readonly pages: PDFPage[] = [];
  page!: PDFPage;
  y = 0;
  private readonly supported: ReadonlySet<number>;
  readonly simplified: string[] = [];
  /** Called after a page break (the measures table repeats its header there). */
  onNewPage: (() => void) | null = null;

  constructor(
    private readonly doc: PDFDocument,
    readonly fonts: Fonts,
  ) {
    this.supported = new Set(fonts.regular.getCharacterSet());
    this.newPage();
  }

  newPage(): void {
    this.page = this.doc.addPage([PAGE_WIDTH, PAGE_HEIGHT]);
    this.pages.push(this.page);
    this.y = MARGIN_TOP;
    this.onNewPage?.();
  }

  /** Starts a new page unless `height` more points fit on this one. */
  ensure(height: number): void {
    if (this.y + height > CONTENT_BOTTOM && this.y > MARGIN_TOP) this.newPage();
  }

  safe(text: string): string {
    const result = pdfSafeText(text, this.supported);
    for (const s of result.simplified) if (!this.simplified.includes(s)) this.simplified.push(s);
    return result.text;
  }

  width(run: Run, size: number): number {
    return run.font.widthOfTextAtSize(run.text, size);
  }

  /** Breaks text runs into lines no wider than `width` at `size`: at spaces, or inside a word longer than a line. */
  wrap(parts: readonly TextPart[], width: number, size: number, font: PDFFont = this.fonts.regular): Line[] {
    const words: Run[] = [];
    for (const part of parts) {
      const f = part.strong ? this.fonts.bold : font;
      for (const piece of this.safe(part.text).split(/(\s+)/)) if (piece !== '') words.push({ text: piece, font: f });
    }
    const lines: Run[][] = [];
    let line: Run[] = [];
    let used = 0;
    const push = () => {
      while (line.length > 0 && /^\s+$/.test(line[line.length - 1]!.text)) line.pop();
      lines.push(line);
      line = [];
      used = 0;
    };
    for (const word of words) {
      const isSpace = /^\s+$/.test(word.text);
      if (isSpace && line.length === 0) continue;
      const w = this.width(word, size);
      if (used + w <= width || isSpace) {
        line.push(word.text.includes('\n') ? { ...word, text: ' ' } : word);
        used += w;
        continue;
      }
      if (line.length > 0) push();
      // A word longer than the line is cut where it fills the line.
      let rest = word.text;
      while (word.font.widthOfTextAtSize(rest, size) > width && rest.length > 1) {
        let cut = rest.length - 1;
        while (cut > 1 && word.font.widthOfTextAtSize(rest.slice(0, cut), size) > width) cut--;
        lines.push([{ text: rest.slice(0, cut), font: word.font }]);
        rest = rest.slice(cut);
      }
      line.push({ text: rest, font: word.font });
      used = word.font.widthOfTextAtSize(rest, size);
    }
    if (line.length > 0) push();
    return lines.length > 0 ? lines : [[]];
  }

  /** Draws one line with its top at `top` (points from the page top). */
  drawLine(line: Line, x: number, top: number, style: Style): void {
    let at = x;
    // Runs of one font are drawn as one string, so text extraction keeps the spaces between words.
    const merged: Run[] = [];
    for (const run of line) {
      const last = merged[merged.length - 1];
      if (last && last.font === run.font) merged[merged.length - 1] = { text: last.text + run.text, font: run.font };
      else merged.push(run);
    }
    for (const run of merged) {
      this.page.drawText(run.text, { x: at, y: PAGE_HEIGHT - top - style.size * 0.8, size: style.size, font: run.font, color: style.color ?? INK });
      at += this.width(run, style.size);
    }
  }

  lineHeight(size: number): number {
    return size * LINE;
  }

  /** Draws wrapped lines from `top`; returns the height used. */
  drawLines(lines: readonly Line[], x: number, top: number, style: Style): number {
    lines.forEach((line, i) => this.drawLine(line, x, top + i * this.lineHeight(style.size), style));
    return lines.length * this.lineHeight(style.size);
  }

  /** A paragraph across `width` from `x`, moving the cursor; a paragraph taller than the room left starts a page. */
  paragraph(parts: readonly TextPart[], style: Style, options: { x?: number; width?: number; gapAfter?: number; font?: PDFFont } = {}): void {
    const x = options.x ?? MARGIN_X;
    const lines = this.wrap(parts, options.width ?? CONTENT_WIDTH - (x - MARGIN_X), style.size, options.font);
    for (const line of lines) {
      this.ensure(this.lineHeight(style.size));
      this.drawLine(line, x, this.y, style);
      this.y += this.lineHeight(style.size);
    }
    this.y += options.gapAfter ?? 2;
  }

  heading(text: string, keepWith: number): void {
    this.y += 8;
    this.ensure(16 + keepWith);
    this.drawLine([{ text: this.safe(text), font: this.fonts.bold }], MARGIN_X, this.y, { size: 10 });
    this.y += 13;
    this.rule(this.y, RULE, 0.6);
    this.y += 4;
  }

  rule(top: number, color: RGB, thickness: number, x = MARGIN_X, width = CONTENT_WIDTH): void {
    this.page.drawLine({ start: { x, y: PAGE_HEIGHT - top }, end: { x: x + width, y: PAGE_HEIGHT - top }, thickness, color });
  }
}

const verdictColour = (m: ReportMeasure): RGB => (m.verdict === 'improved' ? GOOD : m.verdict === 'worsened' ? BAD : INK);

/** Draws a measure's small chart with its top left corner at (x, top): the page's SVG, in PDF vectors. */
function drawChart(sheet: Sheet, m: ReportMeasure, x: number, top: number): void {
  const g = reportChartGeometry(m.chart, REPORT_CHART_BOX);
  const s = CHART_SCALE;
  const px = (gx: number) => x + (REPORT_CHART_AXIS_PX + gx) * s;
  const py = (gy: number) => PAGE_HEIGHT - top - gy * s;
  const page = sheet.page;
  if (g.band) page.drawRectangle({ x: px(0), y: py(g.band.y + g.band.height), width: REPORT_CHART_BOX.widthPx * s, height: g.band.height * s, color: BAND });
  for (const ex of g.eventXs) {
    page.drawLine({ start: { x: px(ex), y: py(2) }, end: { x: px(ex), y: py(REPORT_CHART_BOX.heightPx - 2) }, thickness: 0.6, color: EVENT, dashArray: [3 * s, 2 * s] });
  }
  for (let i = 1; i < g.dots.length; i++) {
    const a = g.dots[i - 1]!;
    const b = g.dots[i]!;
    page.drawLine({ start: { x: px(a.x), y: py(a.y) }, end: { x: px(b.x), y: py(b.y) }, thickness: 1.5 * s, color: BRAND });
  }
  for (const d of g.dots) {
    page.drawCircle({ x: px(d.x), y: py(d.y), size: 2.6 * s, color: d.baseline ? WHITE : BRAND, ...(d.baseline ? { borderColor: BRAND, borderWidth: 1.5 * s } : {}) });
  }
  const labelPt = 5.5;
  const label = (text: string, gy: number) => {
    const safe = sheet.safe(text);
    const w = sheet.fonts.regular.widthOfTextAtSize(safe, labelPt);
    page.drawText(safe, { x: x + (REPORT_CHART_AXIS_PX - 3) * s - w, y: py(gy) - labelPt * 0.35, size: labelPt, font: sheet.fonts.regular, color: MUTED });
  };
  label(g.topLabel, REPORT_CHART_BOX.padPx);
  label(g.bottomLabel, REPORT_CHART_BOX.heightPx - REPORT_CHART_BOX.padPx);
}

function measuresTable(sheet: Sheet, r: ReferralReport, day: (d: string) => string): void {
  const columnX: number[] = [];
  let at = MARGIN_X;
  for (const w of COLUMN_WIDTHS) {
    columnX.push(at);
    at += w;
  }
  const chartX = MARGIN_X + CONTENT_WIDTH - CHART_WIDTH;
  const header = () => {
    const names = [REPORT_COLUMNS.measure, REPORT_COLUMNS.baseline, REPORT_COLUMNS.latest, REPORT_COLUMNS.change, REPORT_COLUMNS.mdc];
    names.forEach((name, i) => sheet.drawLine([{ text: name, font: sheet.fonts.bold }], columnX[i]! + CELL_PAD, sheet.y, { size: SMALL_PT, color: MUTED }));
    sheet.drawLine([{ text: REPORT_COLUMNS.course, font: sheet.fonts.bold }], chartX, sheet.y, { size: SMALL_PT, color: MUTED });
    sheet.y += sheet.lineHeight(SMALL_PT) + 1;
    sheet.rule(sheet.y, MUTED, 0.6);
    sheet.y += 2;
  };
  header();
  sheet.onNewPage = header;
  const small = sheet.lineHeight(SMALL_PT);
  const body = sheet.lineHeight(BODY_PT);
  for (const m of r.measures) {
    const inner = (i: number) => COLUMN_WIDTHS[i]! - 2 * CELL_PAD;
    const title = sheet.wrap([{ text: m.title, strong: true }], inner(0), BODY_PT);
    const cell = (value: string | null, when: string | null, i: number) => ({
      value: sheet.wrap([{ text: value ?? '–' }], inner(i), BODY_PT),
      when: when ? sheet.wrap([{ text: when }], inner(i), SMALL_PT) : [],
    });
    const baseline = cell(m.baselineText, m.baselineDays.length > 0 ? m.baselineDays.map(day).join(', ') : null, 1);
    const latest = cell(m.latestText, m.latestDay ? day(m.latestDay) : null, 2);
    const change = sheet.wrap([{ text: m.changeText }], inner(3), BODY_PT);
    const mdcWidth = inner(4) - (m.noteNumber ? sheet.fonts.regular.widthOfTextAtSize(String(m.noteNumber), 6) + 1 : 0);
    const mdc = sheet.wrap([{ text: m.mdcText }], mdcWidth, BODY_PT);
    const sentence = sheet.wrap([{ text: m.sentence }], TEXT_COLUMNS_WIDTH - 2 * CELL_PAD, 8);
    const topHeight = Math.max(title.length * body, baseline.value.length * body + baseline.when.length * small, latest.value.length * body + latest.when.length * small, change.length * body, mdc.length * body);
    const sentenceHeight = sentence.length * sheet.lineHeight(8);
    const rowHeight = Math.max(topHeight + sentenceHeight, CHART_HEIGHT + 2) + 2 * CELL_PAD;
    sheet.ensure(rowHeight);
    const top = sheet.y + CELL_PAD;
    sheet.drawLines(title, columnX[0]! + CELL_PAD, top, { size: BODY_PT });
    for (const [c, i] of [
      [baseline, 1],
      [latest, 2],
    ] as const) {
      const used = sheet.drawLines(c.value, columnX[i]! + CELL_PAD, top, { size: BODY_PT });
      sheet.drawLines(c.when, columnX[i]! + CELL_PAD, top + used, { size: SMALL_PT, color: MUTED });
    }
    sheet.drawLines(change, columnX[3]! + CELL_PAD, top, { size: BODY_PT });
    sheet.drawLines(mdc, columnX[4]! + CELL_PAD, top, { size: BODY_PT });
    if (m.noteNumber) {
      // The note number as a superscript after the MDC, as the page's footnote link.
      const lastLine = mdc[mdc.length - 1]!;
      const w = lastLine.reduce((sum, run) => sum + sheet.width(run, BODY_PT), 0);
      sheet.drawLine([{ text: String(m.noteNumber), font: sheet.fonts.regular }], columnX[4]! + CELL_PAD + w + 1, top + (mdc.length - 1) * body - 1.5, { size: 6 });
    }
    sheet.drawLines(sentence, columnX[0]! + CELL_PAD, top + topHeight, { size: 8, color: verdictColour(m) });
    drawChart(sheet, m, chartX, sheet.y + (rowHeight - CHART_HEIGHT) / 2);
    sheet.y += rowHeight;
    sheet.rule(sheet.y, LIGHT_RULE, 0.5);
  }
  sheet.onNewPage = null;
  sheet.y += 3;
}

function adherenceWeeks(sheet: Sheet, r: ReferralReport, week: (w: string) => string): void {
  const weeks = r.adherence?.weeks ?? [];
  const cellWidth = 28;
  const perRow = Math.floor(CONTENT_WIDTH / cellWidth);
  const barHeight = 16;
  const cellHeight = barHeight + 2 + 2 * sheet.lineHeight(5.8);
  for (let start = 0; start < weeks.length; start += perRow) {
    sheet.ensure(cellHeight);
    weeks.slice(start, start + perRow).forEach((w, i) => {
      const cx = MARGIN_X + i * cellWidth + cellWidth / 2;
      const barTop = sheet.y;
      sheet.page.drawRectangle({ x: cx - 4, y: PAGE_HEIGHT - barTop - barHeight, width: 8, height: barHeight, color: WHITE, borderColor: RULE, borderWidth: 0.6 });
      const share = Number.isNaN(w.share) ? 0 : Math.max(0, Math.min(1, w.share));
      if (share > 0) sheet.page.drawRectangle({ x: cx - 4, y: PAGE_HEIGHT - barTop - barHeight, width: 8, height: barHeight * share, color: BRAND });
      for (const [text, row] of [
        [weekShareText(w.share), 0],
        [week(w.weekStart), 1],
      ] as const) {
        const safe = sheet.safe(text);
        const tw = sheet.fonts.regular.widthOfTextAtSize(safe, 5.8);
        sheet.drawLine([{ text: safe, font: sheet.fonts.regular }], cx - tw / 2, barTop + barHeight + 2 + row * sheet.lineHeight(5.8), { size: 5.8 });
      }
    });
    sheet.y += cellHeight + 2;
  }
}

/** Header: title, who, facts at the left; prepared on/by at the right; a brand rule under it; then the scope. */
function reportHeader(sheet: Sheet, r: ReferralReport, day: (d: string) => string): void {
  const fonts = sheet.fonts;
  const prepared = reportPreparedLines(r, day).map((line) => sheet.safe(line));
  const preparedWidth = Math.max(...prepared.map((line) => fonts.regular.widthOfTextAtSize(line, BODY_PT)));
  const leftWidth = CONTENT_WIDTH - preparedWidth - 12;
  prepared.forEach((line, i) => {
    const w = fonts.regular.widthOfTextAtSize(line, BODY_PT);
    sheet.drawLine([{ text: line, font: fonts.regular }], MARGIN_X + CONTENT_WIDTH - w, sheet.y + 2 + i * sheet.lineHeight(BODY_PT), { size: BODY_PT, color: MUTED });
  });
  sheet.drawLine([{ text: sheet.safe(REPORT_TITLE), font: fonts.bold }], MARGIN_X, sheet.y, { size: 14 });
  sheet.y += 19;
  const whoLines = sheet.wrap(reportWhoParts(r, day), leftWidth, BODY_PT);
  // The code in a fixed-width face, as on the page.
  const codeLines = whoLines.map((line) => line.map((run) => (run.text === r.patientCode && run.font === fonts.bold ? { ...run, font: fonts.code } : run)));
  sheet.y += sheet.drawLines(codeLines, MARGIN_X, sheet.y, { size: BODY_PT });
  sheet.y += sheet.drawLines(sheet.wrap([{ text: r.patientFacts }], leftWidth, BODY_PT), MARGIN_X, sheet.y, { size: BODY_PT, color: MUTED });
  sheet.y = Math.max(sheet.y, MARGIN_TOP + 2 + prepared.length * sheet.lineHeight(BODY_PT)) + 3;
  sheet.rule(sheet.y, BRAND, 1.5);
  sheet.y += 6;
  sheet.paragraph(reportScopeParts(r, day), { size: BODY_PT });
}

/** The interventions in the period, one bulleted line each. */
function interventionList(sheet: Sheet, r: ReferralReport, day: (d: string) => string): void {
  const fonts = sheet.fonts;
  sheet.heading(REPORT_HEADINGS.interventions, sheet.lineHeight(BODY_PT));
  if (r.interventions.length === 0) sheet.paragraph([{ text: NO_INTERVENTIONS_TEXT }], { size: BODY_PT });
  for (const i of r.interventions) {
    const lines = sheet.wrap([{ text: `${day(i.day)} `, strong: true }, { text: interventionDetails(i) }], CONTENT_WIDTH - 10, BODY_PT);
    sheet.ensure(lines.length * sheet.lineHeight(BODY_PT));
    sheet.drawLine([{ text: '•', font: fonts.regular }], MARGIN_X + 2, sheet.y, { size: BODY_PT });
    sheet.y += sheet.drawLines(lines, MARGIN_X + 10, sheet.y, { size: BODY_PT });
  }
}

/** Where each MDC comes from, numbered as the table's notes. */
function mdcNotes(sheet: Sheet, r: ReferralReport): void {
  const fonts = sheet.fonts;
  if (r.notes.length > 0) {
    sheet.heading(REPORT_HEADINGS.notes, sheet.lineHeight(SMALL_PT));
    r.notes.forEach((note, n) => {
      const lines = sheet.wrap([{ text: note }], CONTENT_WIDTH - 14, SMALL_PT);
      sheet.ensure(lines.length * sheet.lineHeight(SMALL_PT));
      sheet.drawLine([{ text: `${n + 1}.`, font: fonts.regular }], MARGIN_X + 2, sheet.y, { size: SMALL_PT });
      sheet.y += sheet.drawLines(lines, MARGIN_X + 14, sheet.y, { size: SMALL_PT }) + 1;
    });
  }
}

/** Cautions: kept together, with the accent bar at their left as on the page. */
function cautions(sheet: Sheet, r: ReferralReport): void {
  const fonts = sheet.fonts;
  const cautionLines = r.cautions.map((c) => sheet.wrap([{ text: c }], CONTENT_WIDTH - 22, 8));
  const cautionsHeight = 8 + 16 + cautionLines.reduce((sum, lines) => sum + lines.length * sheet.lineHeight(8) + 1, 0);
  sheet.ensure(cautionsHeight);
  sheet.y += 8;
  const cautionsTop = sheet.y;
  sheet.drawLine([{ text: sheet.safe(REPORT_HEADINGS.cautions), font: fonts.bold }], MARGIN_X + 9, sheet.y, { size: 10 });
  sheet.y += 15;
  for (const lines of cautionLines) {
    sheet.drawLine([{ text: '•', font: fonts.regular }], MARGIN_X + 10, sheet.y, { size: 8 });
    sheet.y += sheet.drawLines(lines, MARGIN_X + 18, sheet.y, { size: 8 }) + 1;
  }
  sheet.page.drawRectangle({ x: MARGIN_X, y: PAGE_HEIGHT - sheet.y, width: 3, height: sheet.y - cautionsTop, color: ACCENT });
}

/** Footer on every page: what the report is, whose, the period, and the page number. */
function pageFooters(sheet: Sheet, r: ReferralReport, day: (d: string) => string): void {
  const fonts = sheet.fonts;
  const footer = sheet.safe(reportFooterText(r, day));
  sheet.pages.forEach((page, i) => {
    const y = MARGIN_BOTTOM - 2;
    page.drawText(footer, { x: MARGIN_X, y, size: 7, font: fonts.regular, color: MUTED });
    const number = `Page ${i + 1} of ${sheet.pages.length}`;
    page.drawText(number, { x: MARGIN_X + CONTENT_WIDTH - fonts.regular.widthOfTextAtSize(number, 7), y, size: 7, font: fonts.regular, color: MUTED });
  });
}

/**
 * Writes the referral report as an A4 PDF: the page's content in the page's order (header, scope,
 * interventions, measures with their charts as vector drawings, home programme, assessments, MDC
 * notes, cautions), real text in the standard Helvetica and Courier fonts (extractable, searchable),
 * a footer with the code and page numbers on every page. Everything said comes from `report` and
 * report-wording.ts: no verdict or figure is computed here. Pure apart from pdf-lib; cost linear in
 * the report's size. Throws only what pdf-lib throws (none is expected for a report referralReport made).
 */
export async function referralReportPdf(report: ReferralReport, options: ReferralReportPdfOptions): Promise<ReferralReportPdf> {
  // updateMetadata false: pdf-lib would otherwise stamp the clock; the caller's time is used instead.
  const doc = await PDFDocument.create({ updateMetadata: false });
  const fonts: Fonts = {
    regular: await doc.embedFont(StandardFonts.Helvetica),
    bold: await doc.embedFont(StandardFonts.HelveticaBold),
    code: await doc.embedFont(StandardFonts.CourierBold),
  };
  const day = reportDayFormatter(options.locale);
  const week = reportWeekFormatter(options.locale);
  const sheet = new Sheet(doc, fonts);
  const r = report;

  reportHeader(sheet, r, day);

  interventionList(sheet, r, day);

  sheet.heading(REPORT_HEADINGS.measures, 3 * sheet.lineHeight(BODY_PT) + CHART_HEIGHT);
  sheet.paragraph([{ text: r.summaryText, strong: true }], { size: BODY_PT });
  if (r.measures.length > 0) {
    measuresTable(sheet, r, day);
    sheet.paragraph([{ text: REPORT_CHART_LEGEND }], { size: SMALL_PT, color: MUTED });
  }
  const notRemeasured = notRemeasuredText(r);
  if (notRemeasured) sheet.paragraph([{ text: notRemeasured }], { size: SMALL_PT, color: MUTED });

  if (r.adherence) {
    sheet.heading(REPORT_HEADINGS.adherence, 2 * sheet.lineHeight(BODY_PT) + 30);
    sheet.paragraph([{ text: r.adherence.text }], { size: BODY_PT });
    adherenceWeeks(sheet, r, week);
  }

  sheet.heading(REPORT_HEADINGS.visits, sheet.lineHeight(BODY_PT));
  const visits = reportVisitLines(r, day);
  if (!visits) sheet.paragraph([{ text: NO_VISITS_TEXT }], { size: BODY_PT });
  else {
    sheet.paragraph([{ text: visits.visits }], { size: BODY_PT });
    sheet.paragraph([{ text: visits.assessors }], { size: BODY_PT });
  }

  mdcNotes(sheet, r);
  cautions(sheet, r);
  pageFooters(sheet, r, day);

  // Metadata: code and period only (never the name), so a file list or a mail client shows no name.
  doc.setTitle(`${REPORT_TITLE} ${r.patientCode} ${r.fromDay} to ${r.throughDay}`);
  doc.setCreator('Kinnote');
  doc.setProducer('Kinnote (pdf-lib)');
  doc.setLanguage('en');
  doc.setCreationDate(new Date(options.createdAtMs));
  doc.setModificationDate(new Date(options.createdAtMs));
  const bytes = await doc.save();
  return { bytes, pageCount: sheet.pages.length, fileName: reportPdfFileName(r), simplified: [...sheet.simplified] };
}
