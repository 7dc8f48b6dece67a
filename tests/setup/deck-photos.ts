import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll } from 'vitest';

/** A photo of an invented block deck: grey casting with eight dark bores, made here so the tests need no files. */
async function makeDeckPhoto(path: string, shade: string) {
  const bores = Array.from({ length: 4 }, (_, i) => `<circle cx="${260 + i * 360}" cy="420" r="150" fill="#2a2d31"/><circle cx="${260 + i * 360}" cy="800" r="150" fill="#2a2d31"/>`).join('');
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="1600" height="1200"><rect width="1600" height="1200" fill="${shade}"/>${bores}</svg>`;
  await sharp(Buffer.from(svg)).jpeg({ quality: 85 }).toFile(path);
}

/**
 * For a browser test file: two deck photos (deck-left.jpg, deck-right.jpg) in a
 * temporary folder named from `prefix`, made before the file's tests and removed
 * after them. Read `left` and `right` (their paths) inside the tests.
 */
export function deckPhotos(prefix: string) {
  let dir: string | undefined;
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), prefix));
    await Promise.all([makeDeckPhoto(join(dir, 'deck-left.jpg'), '#9aa0a6'), makeDeckPhoto(join(dir, 'deck-right.jpg'), '#b5b0a4')]);
  });
  afterAll(() => {
    if (dir) rmSync(dir, { recursive: true, force: true });
  });
  const path = (name: string) => {
    if (!dir) throw new Error('the deck photos are made only for the tests');
    return join(dir, name);
  };
  return {
    get left() {
      return path('deck-left.jpg');
    },
    get right() {
      return path('deck-right.jpg');
    },
  };
}
