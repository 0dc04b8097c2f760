/**
 * Renders a teardown report or build sheet as a PDF with pdf-lib and the shipped Source Sans 3
 * (subset-embedded). `renderRunReport(data)` takes the pure report data, so the benchmark and
 * tests can call it without a database.
 */
import fs from 'node:fs';
import path from 'node:path';
import { createRequire } from 'node:module';
import fontkit from '@pdf-lib/fontkit';
import { PDFDocument, PDFHexString, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import { EXAMPLE_DATA_NOTE } from '../../domain/procedure/example-data';
import { MEANING_LABELS, type SignoffMeaning } from '../../domain/signoff';
import { columnWidths, pageLabel, withGlyphs, wrapText } from './layout';
import type { ReportData } from './report-data';

type Weight = 400 | 600 | 700;
type FontFile = { bytes: Uint8Array; has: (cp: number) => boolean };
const fontFiles = new Map<Weight, FontFile>();

function fontDir(): string {
  try {
    return path.join(path.dirname(createRequire(import.meta.url).resolve('@fontsource/source-sans-3/package.json')), 'files');
  } catch {
    return path.join(process.cwd(), 'node_modules', '@fontsource', 'source-sans-3', 'files');
  }
}

function fontFile(weight: Weight): FontFile {
  let f = fontFiles.get(weight);
  if (!f) {
    const bytes = new Uint8Array(fs.readFileSync(path.join(fontDir(), `source-sans-3-latin-${weight}-normal.woff`)));
    const face = fontkit.create(bytes as unknown as Buffer) as unknown as { hasGlyphForCodePoint: (cp: number) => boolean };
    const cache = new Map<number, boolean>();
    f = { bytes, has: (cp) => { let v = cache.get(cp); if (v === undefined) { v = face.hasGlyphForCodePoint(cp); cache.set(cp, v); } return v; } };
    fontFiles.set(weight, f);
  }
  return f;
}

const A4: [number, number] = [595.28, 841.89];
const M = 40;
const INK = rgb(0.11, 0.13, 0.15);
const MUTED = rgb(0.31, 0.34, 0.38);
const LINE = rgb(0.79, 0.76, 0.71);
const BAD = rgb(0.64, 0.14, 0.16);

type Col = { header: string; weight: number };

/**
 * Lays text out glyph by glyph from a per-character cache instead of shaping every string with
 * fontkit (which dominated the time of a long report). Reports lose kerning pairs, nothing else:
 * Source Sans 3's latin subset has no ligatures we use.
 */
function fastFont(font: PDFFont): PDFFont {
  const encode = font.encodeText.bind(font);
  const width = font.widthOfTextAtSize.bind(font);
  const hex = new Map<string, string>();
  const adv = new Map<string, number>();
  font.encodeText = (text: string) => {
    let out = '';
    for (const ch of text) {
      let h = hex.get(ch);
      if (h === undefined) {
        h = encode(ch).asString();
        hex.set(ch, h);
      }
      out += h;
    }
    return PDFHexString.of(out);
  };
  font.widthOfTextAtSize = (text: string, size: number) => {
    let total = 0;
    for (const ch of text) {
      let w = adv.get(ch);
      if (w === undefined) {
        w = width(ch, 1);
        adv.set(ch, w);
      }
      total += w;
    }
    return total * size;
  };
  return font;
}

/** A small flowing-text writer: headings, paragraphs and tables that break across pages. */
class Writer {
  page!: PDFPage;
  y = 0;
  readonly pages: PDFPage[] = [];
  constructor(
    readonly doc: PDFDocument,
    readonly fonts: Record<Weight, PDFFont>,
    readonly has: (cp: number) => boolean,
    readonly header: string,
  ) {
    this.newPage();
  }
  get width() {
    return A4[0] - 2 * M;
  }
  text(s: string) {
    return withGlyphs(s, this.has);
  }
  newPage() {
    this.page = this.doc.addPage(A4);
    this.pages.push(this.page);
    this.page.drawText(this.text(this.header), { x: M, y: A4[1] - 26, size: 8, font: this.fonts[400], color: MUTED });
    this.y = A4[1] - M - 6;
  }
  ensure(h: number) {
    if (this.y - h < M + 24) this.newPage();
  }
  /** Text widths at size 1, cached per word: fontkit's layout is slow, and reports repeat the same words thousands of times. */
  private readonly widths: Record<Weight, Map<string, number>> = { 400: new Map(), 600: new Map(), 700: new Map() };
  unitWidth(word: string, weight: Weight): number {
    const cache = this.widths[weight];
    let w = cache.get(word);
    if (w === undefined) {
      w = this.fonts[weight].widthOfTextAtSize(word, 1);
      cache.set(word, w);
    }
    return w;
  }
  measure(t: string, size: number, weight: Weight): number {
    let total = 0;
    const words = t.split(' ');
    for (const word of words) if (word) total += this.unitWidth(word, weight);
    return (total + (words.length - 1) * this.unitWidth(' ', weight)) * size;
  }
  lines(s: string, size: number, weight: Weight, width: number): string[] {
    return wrapText(this.text(s), width, (t) => this.measure(t, size, weight));
  }
  heading(s: string, size = 13) {
    this.ensure(size * 2.6);
    this.y -= size * 0.9;
    this.page.drawText(this.text(s), { x: M, y: this.y - size, size, font: this.fonts[700], color: INK });
    this.y -= size * 1.5;
  }
  para(s: string, opts: { size?: number; weight?: Weight; color?: ReturnType<typeof rgb> } = {}) {
    const size = opts.size ?? 9.5;
    for (const line of this.lines(s, size, opts.weight ?? 400, this.width)) {
      this.ensure(size * 1.35);
      this.page.drawText(line, { x: M, y: this.y - size, size, font: this.fonts[opts.weight ?? 400], color: opts.color ?? INK });
      this.y -= size * 1.35;
    }
    this.y -= 2;
  }
  pairs(rows: Array<[string, string]>) {
    const size = 9.5;
    for (const [k, v] of rows) {
      const ls = this.lines(v || '—', size, 400, this.width - 130);
      this.ensure(ls.length * size * 1.35);
      this.page.drawText(this.text(k), { x: M, y: this.y - size, size, font: this.fonts[600], color: INK });
      ls.forEach((l, i) => this.page.drawText(l, { x: M + 130, y: this.y - size - i * size * 1.35, size, font: this.fonts[400], color: INK }));
      this.y -= ls.length * size * 1.35 + 1;
    }
  }
  table(cols: Col[], rows: string[][], opts: { bad?: (row: number) => boolean; empty?: string } = {}) {
    const size = 8.5;
    const lh = size * 1.3;
    const widths = columnWidths(cols.map((c) => c.weight), this.width);
    const drawRow = (cells: string[], weight: Weight, color = INK) => {
      const wrapped = cells.map((c, i) => this.lines(c, size, weight, widths[i]! - 6));
      const h = Math.max(...wrapped.map((w) => w.length)) * lh + 4;
      return { h, draw: () => {
        let x = M;
        wrapped.forEach((ls, i) => {
          ls.forEach((l, j) => this.page.drawText(l, { x: x + 2, y: this.y - 2 - size - j * lh, size, font: this.fonts[weight], color }));
          x += widths[i]!;
        });
        this.y -= h;
        this.page.drawLine({ start: { x: M, y: this.y }, end: { x: M + this.width, y: this.y }, thickness: 0.4, color: LINE });
      } };
    };
    const head = () => drawRow(cols.map((c) => c.header), 600);
    if (rows.length === 0) {
      this.para(opts.empty ?? 'None.', { color: MUTED });
      return;
    }
    let h0 = head();
    this.ensure(h0.h + lh * 2);
    h0.draw();
    rows.forEach((r, i) => {
      const row = drawRow(r, 400, opts.bad?.(i) ? BAD : INK);
      if (this.y - row.h < M + 24) {
        this.newPage();
        h0 = head();
        h0.draw();
      }
      row.draw();
    });
    this.y -= 6;
  }
}

const meaningLabel = (m: string) => MEANING_LABELS[m as SignoffMeaning] ?? m;
const mark = (inSpec: boolean | null) => (inSpec === null ? '? not read' : inSpec ? 'OK in spec' : 'X OUT of spec');

/** The report or build sheet for one run, as PDF bytes. */
export async function renderRunReport(data: ReportData): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  doc.registerFontkit(fontkit);
  const fonts = {
    400: fastFont(await doc.embedFont(fontFile(400).bytes, { subset: true })),
    600: fastFont(await doc.embedFont(fontFile(600).bytes, { subset: true })),
    700: fastFont(await doc.embedFont(fontFile(700).bytes, { subset: true })),
  } as Record<Weight, PDFFont>;
  const has = (cp: number) => fontFile(400).has(cp) && fontFile(700).has(cp);
  doc.setTitle(`${data.title} ${data.job.code} — ${data.procedure.name}`);
  doc.setProducer('Torquetrail');
  doc.setCreationDate(new Date(data.generatedAt));
  const w = new Writer(doc, fonts, has, `${data.shopName} · ${data.title} · ${data.job.code} · ${data.procedure.name} rev ${data.procedure.revisionNumber}`);

  w.heading(`${data.title}: ${data.job.code}`, 18);
  if (data.exampleData) w.para(`${EXAMPLE_DATA_NOTE}. This procedure is demo material; its numbers are invented.`, { weight: 700, color: BAD });
  w.pairs([
    ['Unit', data.job.unitDescription],
    ['Serial', data.job.serial],
    ['Hours / odometer', data.job.hoursOrOdometer],
    ['Customer', data.job.customer],
    ['Procedure', `${data.procedure.name}, revision ${data.procedure.revisionNumber} (${data.procedure.kind})`],
    ['Run', `${data.run.done} of ${data.run.total} steps finished; ${data.run.status}; started ${data.run.createdAt.slice(0, 10)}`],
    ['Photos', String(data.photos)],
    ['Generated', data.generatedAt.replace('T', ' ').slice(0, 16) + ' UTC'],
  ]);

  w.heading('Readings against spec');
  w.table(
    [{ header: 'Step', weight: 2.2 }, { header: 'Position', weight: 0.9 }, { header: 'Readings', weight: 3 }, { header: 'Spec (nominal, limits)', weight: 1.8 }, { header: 'Result', weight: 3 }, { header: 'Verdict', weight: 1.2 }],
    data.readings.map((r) => [r.step, r.position, r.readings, r.spec, r.result, mark(r.inSpec)]),
    { bad: (i) => data.readings[i]!.inSpec === false, empty: 'No readings on this run.' },
  );

  if (data.kind === 'build' || data.passes.length > 0) {
    w.heading(data.kind === 'build' ? 'Fasteners and torque passes applied' : 'Fastener sequences worked');
    w.table(
      [{ header: 'Step', weight: 2.4 }, { header: 'Pass', weight: 0.6 }, { header: 'Target', weight: 1.8 }, { header: 'Fastener', weight: 0.9 }, { header: 'By', weight: 1.5 }, { header: 'When (UTC)', weight: 1.4 }],
      data.passes.map((p) => [p.step, String(p.pass), p.target, p.fastener, p.by, p.at]),
      { empty: 'No fastener sequences on this run.' },
    );
  }
  if (data.torques.length > 0) {
    w.heading('Single torques');
    w.table([{ header: 'Step', weight: 2.4 }, { header: 'Target', weight: 1.4 }, { header: 'Applied', weight: 1.2 }, { header: 'By', weight: 1.4 }, { header: 'When (UTC)', weight: 1.2 }], data.torques.map((t) => [t.step, t.target, t.applied, t.by, t.at]));
  }
  if (data.kind === 'build' || data.shims.length > 0) {
    w.heading('Shims chosen');
    w.table([{ header: 'Step', weight: 2.2 }, { header: 'Valve', weight: 0.8 }, { header: 'Measured', weight: 1.2 }, { header: 'Installed shim', weight: 1.2 }, { header: 'Chosen shim', weight: 2 }], data.shims.map((s) => [s.step, s.position, s.measured, s.installed, s.chosen]), { empty: 'No shims chosen on this run.' });
  }

  w.heading('Deviations');
  w.table([{ header: 'Step', weight: 2.2 }, { header: 'Kind', weight: 0.9 }, { header: 'Reason', weight: 2.5 }, { header: 'Requested by', weight: 1.3 }, { header: 'Decision', weight: 2.3 }], data.deviations.map((d) => [d.step, d.kind, d.reason, d.requestedBy, d.decision]), { empty: 'No deviations.' });

  w.heading('Findings');
  if (data.findings.length === 0) w.para('No findings recorded.', { color: MUTED });
  for (const f of data.findings) {
    w.para(`${f.title} (${f.severity})`, { weight: 600 });
    if (f.description) w.para(f.description);
    if (f.parts.length) w.para(`Parts to replace: ${f.parts.join(', ')}`);
    for (const photo of f.photos) {
      const img = photo.jpeg ? await doc.embedJpg(photo.jpeg) : photo.png ? await doc.embedPng(photo.png) : null;
      if (!img) continue;
      const scale = Math.min(160 / img.width, 120 / img.height, 1);
      w.ensure(img.height * scale + 16);
      w.page.drawImage(img, { x: M, y: w.y - img.height * scale, width: img.width * scale, height: img.height * scale });
      w.y -= img.height * scale + 2;
      w.para(photo.caption, { size: 8, color: MUTED });
    }
  }

  w.heading('Tags and dispositions');
  w.table([{ header: 'Part', weight: 2.2 }, { header: 'Position', weight: 1 }, { header: 'Disposition', weight: 1.2 }, { header: 'Bin', weight: 1.2 }, { header: 'Photos', weight: 0.7 }], data.tags.map((t) => [t.part, t.position, t.disposition, t.bin, String(t.photos)]), { empty: 'No parts tagged.' });

  w.heading(data.kind === 'build' ? 'Parts replaced' : 'Parts to replace');
  w.table([{ header: 'Part', weight: 2.5 }, { header: 'Qty', weight: 0.6 }, { header: 'Why', weight: 2.5 }], data.parts.map((p) => [p.part, String(p.quantity), p.why]), { empty: 'No parts listed.' });

  w.heading('Steps');
  w.table([{ header: '#', weight: 0.4 }, { header: 'Step', weight: 3 }, { header: 'Kind', weight: 1.1 }, { header: 'State', weight: 0.9 }, { header: 'By', weight: 1.4 }, { header: 'When (UTC)', weight: 1.3 }, { header: 'Note', weight: 2 }], data.steps.map((s) => [String(s.n), s.title, s.kind, s.state, s.by, s.at, s.note]));

  w.heading('Signatures');
  w.table(
    [{ header: 'Covers', weight: 1.6 }, { header: 'Signed by', weight: 1.6 }, { header: 'Meaning', weight: 1.8 }, { header: 'When (UTC)', weight: 1.2 }, { header: 'Record hash (SHA-256)', weight: 3 }, { header: 'Check', weight: 1.3 }],
    data.signatures.map((s) => [s.scope, `${s.signerName} (${s.signerRole})`, meaningLabel(s.meaning), s.signedAt.replace('T', ' ').slice(0, 16), s.recordHash, s.matches ? 'OK matches record' : '! Record changed after signing']),
    { bad: (i) => !data.signatures[i]!.matches, empty: 'Not signed yet.' },
  );

  const total = w.pages.length;
  w.pages.forEach((p, i) => {
    const label = pageLabel(i + 1, total);
    p.drawText(label, { x: A4[0] - M - fonts[400].widthOfTextAtSize(label, 8), y: 22, size: 8, font: fonts[400], color: MUTED });
    if (data.exampleData) p.drawText(withGlyphs(EXAMPLE_DATA_NOTE, has), { x: M, y: 22, size: 8, font: fonts[600], color: BAD });
  });
  return doc.save();
}
