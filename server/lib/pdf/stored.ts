import { createHash } from 'node:crypto';
import { buffer } from 'node:stream/consumers';
import type { FileStorage } from '../storage';

/**
 * Raise this when a document's layout or wording changes (server/lib/pdf,
 * the receipt, invoice and certificate templates): every stored copy is then
 * made afresh on its next request. Changes in the data need nothing: they
 * change the key by themselves.
 */
export const DOCUMENT_TEMPLATES_VERSION = 1;

export type DocumentKind = 'receipts' | 'invoices' | 'certificates';

/**
 * The key a document is kept under: its kind, its record (e.g. the payment or
 * the job and version), and a hash of everything it is printed from, so any
 * change in what it would say (a status, a name, an amount, the shop's or the
 * builder's copy) is another key, and a stored copy is never out of date.
 */
export function documentKey(kind: DocumentKind, record: string, data: unknown): string {
  const hash = createHash('sha256')
    .update(JSON.stringify({ templates: DOCUMENT_TEMPLATES_VERSION, data }))
    .digest('hex')
    .slice(0, 32);
  return `documents/${kind}/${record}-${hash}.pdf`;
}

/**
 * A printed document from storage, made and stored first if it is not there
 * yet. Called after the access checks and with the data they let through, so
 * a stored copy is reached only the way a fresh one would be. Two requests at
 * once may both print it; they store the same document under the same key.
 */
export async function storedDocument<T>(storage: FileStorage, kind: DocumentKind, record: string, data: T, print: (data: T) => Promise<Buffer>): Promise<Buffer> {
  const key = documentKey(kind, record, data);
  const stored = await storage.get(key);
  // A few hundred kilobytes at most: read whole, like a freshly printed one.
  if (stored) return buffer(stored.body);
  const pdf = await print(data);
  await storage.put(key, pdf);
  return pdf;
}
