import { fileURLToPath } from 'node:url';
import { expect } from 'vitest';
import type { signedIn } from './test-env';

/** The text of a version's certificate PDF, downloaded as `who` and read back with pdfjs-dist. */
export async function certificateText(who: Awaited<ReturnType<typeof signedIn>>, jobId: string, version: number): Promise<string> {
  const res = await who.agent.get(`/api/jobs/${jobId}/inspection/${version}/certificate.pdf`).buffer(true).parse((r, done) => {
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
