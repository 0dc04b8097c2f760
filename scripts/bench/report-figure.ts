/**
 * Teardown report PDF for the bench's 500-step run, beside a bare pdf-lib document with the
 * same number of text lines in a standard font (no layout, no embedded font, no data loading).
 */
import { PDFDocument, StandardFonts } from 'pdf-lib';
import { initORM, closeORM } from '../../src/server/db';
import { runReportData } from '../../src/server/services/reports.service';
import { renderRunReport } from '../../src/server/reports/render';
import type { LargeShop } from './large-shop';

async function bareLines(lines: number): Promise<number> {
  const t0 = performance.now();
  const doc = await PDFDocument.create();
  const font = await doc.embedFont(StandardFonts.Helvetica);
  let page = doc.addPage();
  for (let i = 0, y = 800; i < lines; i++, y -= 14) {
    if (y < 40) { page = doc.addPage(); y = 800; }
    page.drawText(`Line ${i}: step s${i % 500} reading 0.050 mm within 0.030–0.080 mm`, { x: 40, y, size: 10, font });
  }
  await doc.save();
  return performance.now() - t0;
}

export async function figure(ctx: { shop: LargeShop }): Promise<Array<[string, string, string, string, string]>> {
  const orm = await initORM();
  try {
    const em = orm.em.fork();
    const rows = await em.getConnection().execute<Array<{ shop_id: string }>>('select shop_id from run where id = ?', [ctx.shop.read500]);
    const shopId = rows[0]?.shop_id;
    if (!shopId) throw new Error('bench run not found');
    const t0 = performance.now();
    const data = await runReportData(em, shopId, ctx.shop.read500);
    const tData = performance.now() - t0;
    const bytes = await renderRunReport(data);
    const tAll = performance.now() - t0;
    const base = await bareLines(3000);
    return [
      ['Teardown report PDF, 500 steps / 260 events', `${(tAll / 1000).toFixed(2)} s (${(bytes.length / 1024).toFixed(0)} KB; data ${(tData / 1000).toFixed(2)} s)`, `${(base / 1000).toFixed(2)} s (bare pdf-lib, 3 000 lines)`, `${((base / tAll) * 100).toFixed(0)} %`, ''],
    ];
  } finally {
    await closeORM();
  }
}
