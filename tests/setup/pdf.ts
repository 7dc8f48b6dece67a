import { buffer } from 'node:stream/consumers';
import { fileURLToPath } from 'node:url';
import { expect } from 'vitest';
import type { AppConfig } from '../../server/env';
import type { FileStorage } from '../../server/lib/storage';
import { storedKeys } from './storage';
import type { signedIn } from './test-env';

type Who = Awaited<ReturnType<typeof signedIn>>;

/** The bytes of a PDF downloaded from `path` as `who`, answered 200 as application/pdf. */
export async function pdfBytes(who: Who, path: string): Promise<Buffer> {
  const res = await who.agent.get(path).buffer(true).parse((r, done) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => done(null, Buffer.concat(chunks)));
  });
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toBe('application/pdf');
  return res.body as Buffer;
}

/** A PDF downloaded from `path` as `who` (answered 200 as application/pdf), read back as text with pdfjs-dist. */
export async function pdfText(who: Who, path: string): Promise<string> {
  const { getDocument } = await import('pdfjs-dist/legacy/build/pdf.mjs');
  const fonts = `${fileURLToPath(new URL('../../node_modules/pdfjs-dist/standard_fonts/', import.meta.url))}`;
  const pdf = await getDocument({ data: new Uint8Array(await pdfBytes(who, path)), standardFontDataUrl: fonts }).promise;
  let text = '';
  for (let p = 1; p <= pdf.numPages; p += 1) {
    const content = await (await pdf.getPage(p)).getTextContent();
    text += content.items.map((item) => ('str' in item ? item.str : '')).join(' ') + '\n';
  }
  return text;
}

/** The text of a version's certificate PDF, downloaded as `who`. */
export const certificateText = (who: Who, jobId: string, version: number): Promise<string> => pdfText(who, `/api/jobs/${jobId}/inspection/${version}/certificate.pdf`);

/** The stored copies of a printed document (server/lib/pdf/stored.ts): its kind's keys that begin with the record. */
export async function storedDocuments(storage: AppConfig['storage'], kind: 'receipts' | 'invoices' | 'certificates', record: string): Promise<string[]> {
  return (await storedKeys(storage, `documents/${kind}/`)).filter((key) => key.startsWith(`documents/${kind}/${record}-`));
}

/**
 * Downloads a document twice and checks that the second answer is the copy
 * kept in storage, not a new print: after the first download exactly one copy
 * is stored, byte for byte what was sent; that copy is then marked (a comment
 * after the PDF's end) and the second download must be the marked bytes.
 * Answers the first download's bytes.
 */
export async function expectStoredCopyServed(
  who: Who,
  path: string,
  app: { config: AppConfig; storage: FileStorage },
  kind: 'receipts' | 'invoices' | 'certificates',
  record: string,
): Promise<Buffer> {
  const first = await pdfBytes(who, path);
  const keys = await storedDocuments(app.config.storage, kind, record);
  expect(keys).toHaveLength(1);
  const stored = await app.storage.get(keys[0]);
  expect(Buffer.compare(await buffer(stored!.body), first)).toBe(0);
  const marked = Buffer.concat([first, Buffer.from('%kept in storage\n')]);
  await app.storage.put(keys[0], marked);
  expect(Buffer.compare(await pdfBytes(who, path), marked)).toBe(0);
  return first;
}
