import compression from 'compression';
import type { Request, RequestHandler, Response } from 'express';
import type { ServerResponse } from 'node:http';

/** What is never compressed: live streams (each event must leave at once) and bodies already compressed. */
const NOT_COMPRESSED = /^(text\/event-stream|image\/(?!svg)|video\/|audio\/|font\/woff2?|application\/(pdf|zip|gzip|x-gzip|octet-stream))/i;

/**
 * Compresses answers with brotli or gzip, whichever the client accepts (brotli first),
 * when they are at least 512 bytes of a compressible type (the app's HTML is about 700;
 * below that the headers cost more than is saved). socket.io answers its own
 * requests before Express sees them, so its streams are untouched here too.
 */
export function compressAnswers(): RequestHandler {
  return compression({
    threshold: 512,
    filter: (req: Request, res: Response) => {
      const type = String(res.getHeader('Content-Type') ?? '');
      if (NOT_COMPRESSED.test(type)) return false;
      return compression.filter(req, res);
    },
  });
}

/** A year, in seconds: files whose name carries their content hash never change under that name. */
const IMMUTABLE = 'public, max-age=31536000, immutable';

/**
 * The Cache-Control of a built file: Vite's hashed files under /assets/ are kept a year
 * without asking again; anything else (index.html, robots.txt, the favicon) is checked
 * with the server on every use.
 */
export function setBuiltFileCaching(res: ServerResponse, filePath: string, dir: string): void {
  const relative = filePath.slice(dir.length).replaceAll('\\', '/').replace(/^\/+/, '');
  res.setHeader('Cache-Control', relative.startsWith('assets/') ? IMMUTABLE : 'no-cache');
}
