import type { Response } from 'express';

/** A file the person downloads (PDF, CSV): its type, its name on their disk, and never kept by a shared cache. */
export function sendDownload(res: Response, file: { type: 'application/pdf' | 'text/csv; charset=utf-8'; filename: string; body: Buffer | string }): void {
  res.set({ 'Content-Type': file.type, 'Content-Disposition': `attachment; filename="${file.filename}"`, 'Cache-Control': 'private, no-store' }).send(file.body);
}
