import { fileURLToPath } from 'node:url';
import { expect } from 'vitest';
import type { signedIn } from './test-env';

type Who = Awaited<ReturnType<typeof signedIn>>;

/** A PDF downloaded from `path` as `who` (answered 200 as application/pdf), read back as text with pdfjs-dist. */
export async function pdfText(who: Who, path: string): Promise<string> {
  const res = await who.agent.get(path).buffer(true).parse((r, done) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => done(null, Buffer.concat(chunks)));
  });
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toBe('application/pdf');
  const { getDocument } = await import('pdfjs-dist/legacy/build/pdf.mjs');
  const fonts = `${fileURLToPath(new URL('../../node_modules/pdfjs-dist/standard_fonts/', import.meta.url))}`;
  const pdf = await getDocument({ data: new Uint8Array(res.body as Buffer), standardFontDataUrl: fonts }).promise;
  let text = '';
  for (let p = 1; p <= pdf.numPages; p += 1) {
    const content = await (await pdf.getPage(p)).getTextContent();
    text += content.items.map((item) => ('str' in item ? item.str : '')).join(' ') + '\n';
  }
  return text;
}

/** The text of a version's certificate PDF, downloaded as `who`. */
export const certificateText = (who: Who, jobId: string, version: number): Promise<string> => pdfText(who, `/api/jobs/${jobId}/inspection/${version}/certificate.pdf`);
