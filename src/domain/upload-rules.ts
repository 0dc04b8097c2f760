/**
 * What a photo upload may be: images only, at most 20 MB, at most 12 photos on one step, tag
 * or finding. The server checks these before presigning and again on completion; the uploader
 * shows the same limits before anything is sent.
 */

/** Image types a bench camera or phone produces, with the file extension we store them under. */
export const PHOTO_TYPES = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
  'image/heic': 'heic',
  'image/heif': 'heif',
} as const;
export type PhotoType = keyof typeof PHOTO_TYPES;

export const MAX_PHOTO_BYTES = 20 * 1024 * 1024;
export const MAX_PHOTOS_PER_SCOPE = 12;

export type UploadRequest = { filename: string; contentType: string; size: number };
export type UploadCheck =
  | { ok: true; ext: string }
  | { ok: false; code: 'unsupported-media-type' | 'payload-too-large' | 'conflict' | 'invalid-input'; field: 'contentType' | 'size' | 'scope' | 'filename'; message: string };

export const isPhotoType = (t: string): t is PhotoType => Object.hasOwn(PHOTO_TYPES, t.toLowerCase());

const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

/** Whether one more photo may be uploaded into a scope already holding `existing` photos. */
export function checkUpload(req: UploadRequest, existing: number): UploadCheck {
  const type = req.contentType.trim().toLowerCase();
  if (!req.filename.trim()) return { ok: false, code: 'invalid-input', field: 'filename', message: 'The file has no name.' };
  if (!isPhotoType(type))
    return { ok: false, code: 'unsupported-media-type', field: 'contentType', message: `“${req.filename}” is not a photo (${type || 'unknown type'}). Upload JPEG, PNG, WebP or HEIC images.` };
  if (!Number.isInteger(req.size) || req.size <= 0) return { ok: false, code: 'invalid-input', field: 'size', message: `“${req.filename}” is empty.` };
  if (req.size > MAX_PHOTO_BYTES)
    return { ok: false, code: 'payload-too-large', field: 'size', message: `“${req.filename}” is ${mb(req.size)}; photos may be at most ${mb(MAX_PHOTO_BYTES)}.` };
  if (existing >= MAX_PHOTOS_PER_SCOPE)
    return { ok: false, code: 'conflict', field: 'scope', message: `This already has ${existing} photos; at most ${MAX_PHOTOS_PER_SCOPE} are kept per step, tag or finding.` };
  return { ok: true, ext: PHOTO_TYPES[type] };
}

/** sharp's format names for each type; HEIC/HEIF decode to 'heif'. */
const SHARP_FORMATS: Record<PhotoType, string[]> = {
  'image/jpeg': ['jpeg', 'jpg'],
  'image/png': ['png'],
  'image/webp': ['webp'],
  'image/heic': ['heif'],
  'image/heif': ['heif'],
};

/** Whether the bytes' detected format is the declared type (a PNG sent as JPEG is refused). */
export function formatMatches(contentType: string, detected: string | undefined): boolean {
  const t = contentType.toLowerCase();
  return isPhotoType(t) && !!detected && SHARP_FORMATS[t].includes(detected.toLowerCase());
}

/** The limits in words, shown before the upload starts. */
export const uploadLimitsText = () => `Photos only (JPEG, PNG, WebP, HEIC), up to ${MAX_PHOTO_BYTES / (1024 * 1024)} MB each, at most ${MAX_PHOTOS_PER_SCOPE} here.`;

const HEIF_BRANDS = new Set(['heic', 'heix', 'heim', 'heis', 'hevc', 'hevx', 'mif1', 'msf1']);

/** Whether the first bytes are an ISO-BMFF `ftyp` box of a HEIC/HEIF image (sharp here cannot decode HEIC). */
export function looksLikeHeif(head: Uint8Array): boolean {
  if (head.length < 12) return false;
  const ascii = (a: number, b: number) => String.fromCharCode(...head.subarray(a, b));
  return ascii(4, 8) === 'ftyp' && HEIF_BRANDS.has(ascii(8, 12));
}
