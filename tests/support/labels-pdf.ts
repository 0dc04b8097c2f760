/** Reads a label sheet PDF back (pdfjs): text per page and each QR image sampled into its module matrix. */
import QRCode from 'qrcode';
import { getDocument, OPS } from 'pdfjs-dist/legacy/build/pdf.mjs';

export async function readLabels(bytes: Uint8Array) {
  const doc = await getDocument({ data: bytes, useSystemFonts: false, isEvalSupported: false }).promise;
  const texts: string[] = [];
  const qrs: boolean[][][] = [];
  for (let n = 1; n <= doc.numPages; n++) {
    const page = await doc.getPage(n);
    // Wrapped lines are joined without a separator, so a code or address split over two lines reads whole.
    texts.push((await page.getTextContent()).items.map((i) => ('str' in i ? i.str : '')).join(''));
    const ops = await page.getOperatorList();
    for (let i = 0; i < ops.fnArray.length; i++) {
      if (ops.fnArray[i] !== OPS.paintImageXObject) continue;
      const name = ops.argsArray[i][0] as string;
      const img = await new Promise<{ width: number; height: number; data: Uint8ClampedArray; kind: number }>((resolve) => page.objs.get(name, resolve));
      qrs.push(sampleModules(img));
    }
  }
  return { pages: doc.numPages, texts, qrs };
}

/** Dark/light per module of a margin-free QR image (size found from the finder pattern). */
function sampleModules(img: { width: number; height: number; data: Uint8ClampedArray; kind: number }): boolean[][] {
  const bpp = img.kind === 3 ? 4 : img.kind === 2 ? 3 : 1;
  const dark = (x: number, y: number) => img.data[(y * img.width + x) * bpp]! < 128;
  let finder = 0; // the top-left finder pattern is 7 modules wide
  while (finder < img.width && dark(finder, 0)) finder++;
  const module = finder / 7;
  const size = Math.round(img.width / module);
  return Array.from({ length: size }, (_, r) => Array.from({ length: size }, (_, c) => dark(Math.floor((c + 0.5) * module), Math.floor((r + 0.5) * module))));
}

export const expectedModules = (text: string) => {
  const q = QRCode.create(text, { errorCorrectionLevel: 'M' });
  return Array.from({ length: q.modules.size }, (_, r) => Array.from({ length: q.modules.size }, (_, c) => !!q.modules.get(r, c)));
};

