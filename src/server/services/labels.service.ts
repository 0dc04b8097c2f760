/**
 * QR labels for a job's tags, on A4 sheets of 3 × 8 labels of 70 × 37 mm (the common
 * "24 per sheet" stock, no side margins, 0.5 mm top and bottom). Each label: a QR code of
 * `${PUBLIC_URL}/tags/<id>` and, beside it, the tag code, part, position and bin in the
 * shipped Source Sans 3 (embedded, subset), with the address in small type for a phone
 * that cannot scan.
 */
import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import fontkit from '@pdf-lib/fontkit';
import type { EntityManager } from '@mikro-orm/postgresql';
import { PDFDocument, rgb, type PDFFont } from 'pdf-lib';
import QRCode from 'qrcode';
import { config } from '../config';
import { listJobTags, type TagDto } from './tags.service';

const MM = 72 / 25.4;
export const SHEET = { width: 210 * MM, height: 297 * MM, cols: 3, rows: 8, labelW: 70 * MM, labelH: 37 * MM, top: 0.5 * MM } as const;
export const PER_SHEET = SHEET.cols * SHEET.rows;

/** Where label `i` (0-based) sits: page, and its lower-left corner in PDF points. */
export function labelSlot(i: number): { page: number; x: number; y: number } {
  const page = Math.floor(i / PER_SHEET);
  const n = i % PER_SHEET;
  const col = n % SHEET.cols;
  const row = Math.floor(n / SHEET.cols);
  return { page, x: col * SHEET.labelW, y: SHEET.height - SHEET.top - (row + 1) * SHEET.labelH };
}

export const tagUrl = (tagId: string) => `${config().PUBLIC_URL.replace(/\/+$/, '')}/tags/${tagId}`;

let fontBytes: Promise<Buffer> | undefined;
const shippedFont = () => (fontBytes ??= readFile(createRequire(import.meta.url).resolve('@fontsource/source-sans-3/files/source-sans-3-latin-400-normal.woff')));

/** Cuts text to fit a width at a size, with an ellipsis. */
function fit(font: PDFFont, text: string, size: number, width: number): string {
  if (font.widthOfTextAtSize(text, size) <= width) return text;
  let t = text;
  while (t.length > 1 && font.widthOfTextAtSize(`${t}…`, size) > width) t = t.slice(0, -1);
  return `${t}…`;
}

/** Breaks text into at most `max` lines that fit, preferring breaks after "-" or "/"; the last line is cut if needed. */
export function wrap(font: PDFFont, text: string, size: number, width: number, max: number): string[] {
  const lines: string[] = [];
  let rest = text;
  while (rest && lines.length < max - 1 && font.widthOfTextAtSize(rest, size) > width) {
    let n = rest.length;
    while (n > 1 && font.widthOfTextAtSize(rest.slice(0, n), size) > width) n--;
    const soft = Math.max(rest.lastIndexOf('-', n - 1), rest.lastIndexOf('/', n - 1));
    const cut = soft > n / 2 ? soft + 1 : n;
    lines.push(rest.slice(0, cut));
    rest = rest.slice(cut);
  }
  if (rest) lines.push(fit(font, rest, size, width));
  return lines;
}

const DISPOSITION_WORDS: Record<TagDto['disposition'], string> = { reuse: 'Reuse', replace: 'Replace', 'machine-shop': 'Machine shop', scrap: 'Scrap' };

/** The label sheet PDF for the given tags. */
export async function renderLabels(tags: readonly TagDto[], title: string): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  doc.setTitle(title);
  doc.setCreator('Torquetrail');
  doc.registerFontkit(fontkit);
  const font = await doc.embedFont(await shippedFont(), { subset: true });
  const pages = [];
  for (let i = 0; i < Math.max(1, Math.ceil(tags.length / PER_SHEET)); i++) pages.push(doc.addPage([SHEET.width, SHEET.height]));
  const pad = 2.5 * MM;
  const qrSide = 26 * MM;
  for (const [i, tag] of tags.entries()) {
    const { page, x, y } = labelSlot(i);
    const p = pages[page]!;
    const png = await QRCode.toBuffer(tagUrl(tag.id), { errorCorrectionLevel: 'M', margin: 0, scale: 8, color: { dark: '#000000', light: '#ffffff' } });
    const img = await doc.embedPng(png);
    p.drawImage(img, { x: x + pad, y: y + (SHEET.labelH - qrSide) / 2, width: qrSide, height: qrSide });
    const tx = x + pad + qrSide + 2 * MM;
    const tw = SHEET.labelW - (tx - x) - pad;
    let ty = y + SHEET.labelH - pad - 9;
    const line = (text: string, size: number, gap = 2) => {
      p.drawText(fit(font, text, size, tw), { x: tx, y: ty, size, font, color: rgb(0, 0, 0) });
      ty -= size + gap;
    };
    for (const l of wrap(font, tag.code, 8.5, tw, 2)) line(l, 8.5, 1);
    ty -= 2;
    line(tag.partName, 9);
    line(`Position ${tag.position}`, 9);
    line(tag.bin ? `Bin ${tag.bin}` : 'Bin —', 9);
    line(DISPOSITION_WORDS[tag.disposition], 8);
    const url = wrap(font, tagUrl(tag.id), 4.5, tw, 2);
    url.forEach((l, k) => p.drawText(l, { x: tx, y: y + pad + (url.length - 1 - k) * 5.5, size: 4.5, font, color: rgb(0.2, 0.2, 0.2) }));
  }
  if (tags.length === 0) pages[0]!.drawText('No tags on this job yet.', { x: 20 * MM, y: SHEET.height - 30 * MM, size: 14, font });
  return doc.save();
}

/** Labels for every tag of a job, or only those of one step. */
export async function jobLabelsPdf(em: EntityManager, shopId: string, jobId: string, stepId?: string): Promise<{ filename: string; bytes: Uint8Array; count: number }> {
  const { job, tags } = await listJobTags(em, shopId, jobId, stepId ? { stepId } : {});
  return { filename: `${job.code}-tag-labels.pdf`, bytes: await renderLabels(tags, `Tag labels · ${job.code}`), count: tags.length };
}
