import { describe, expect, it } from 'vitest';
import { MAX_PHOTO_BYTES, MAX_PHOTOS_PER_SCOPE, checkUpload, formatMatches, looksLikeHeif } from './upload-rules';

describe('checkUpload', () => {
  it.each([
    ['bench.jpg', 'image/jpeg', 1000, 0, 'jpg'],
    ['cap.PNG', 'image/png', MAX_PHOTO_BYTES, 0, 'png'],
    ['shim.webp', 'IMAGE/WEBP', 5, MAX_PHOTOS_PER_SCOPE - 1, 'webp'],
    ['phone.heic', 'image/heic', 5, 3, 'heic'],
    ['phone.heif', 'image/heif', 5, 3, 'heif'],
  ])('accepts %s (%s, %i bytes, %i already)', (filename, contentType, size, existing, ext) => {
    expect(checkUpload({ filename, contentType, size }, existing)).toEqual({ ok: true, ext });
  });

  it.each([
    ['notes.pdf', 'application/pdf', 1000, 0, 'unsupported-media-type', 'contentType', /not a photo/],
    ['x.svg', 'image/svg+xml', 1000, 0, 'unsupported-media-type', 'contentType', /not a photo/],
    ['x', '', 1000, 0, 'unsupported-media-type', 'contentType', /unknown type/],
    ['big.jpg', 'image/jpeg', MAX_PHOTO_BYTES + 1, 0, 'payload-too-large', 'size', /at most 20\.0 MB/],
    ['empty.jpg', 'image/jpeg', 0, 0, 'invalid-input', 'size', /empty/],
    ['frac.jpg', 'image/jpeg', 1.5, 0, 'invalid-input', 'size', /empty/],
    ['full.jpg', 'image/jpeg', 10, MAX_PHOTOS_PER_SCOPE, 'conflict', 'scope', /at most 12/],
    ['  ', 'image/jpeg', 10, 0, 'invalid-input', 'filename', /no name/],
  ])('refuses %s (%s, %i bytes, %i already)', (filename, contentType, size, existing, code, field, message) => {
    const r = checkUpload({ filename, contentType, size }, existing);
    expect(r).toMatchObject({ ok: false, code, field });
    if (!r.ok) expect(r.message).toMatch(message);
  });
});

describe('formatMatches', () => {
  it.each([
    ['image/jpeg', 'jpeg', true],
    ['image/png', 'png', true],
    ['image/webp', 'webp', true],
    ['image/heic', 'heif', true],
    ['image/jpeg', 'png', false],
    ['image/png', 'jpeg', false],
    ['image/gif', 'gif', false],
    ['image/jpeg', undefined, false],
  ])('%s with detected %s → %s', (type, detected, ok) => expect(formatMatches(type, detected)).toBe(ok));
});

describe('looksLikeHeif', () => {
  const box = (brand: string) => new Uint8Array([0, 0, 0, 24, ...[...`ftyp${brand}`].map((c) => c.charCodeAt(0)), 0, 0, 0, 0]);
  it.each([['heic', true], ['mif1', true], ['avif', false], ['isom', false]])('brand %s → %s', (brand, ok) => expect(looksLikeHeif(box(brand))).toBe(ok));
  it('refuses JPEG bytes and short input', () => {
    expect(looksLikeHeif(new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 0, 0, 0, 0, 0, 0, 0, 0]))).toBe(false);
    expect(looksLikeHeif(new Uint8Array([0, 0]))).toBe(false);
  });
});
