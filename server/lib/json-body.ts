import express, { type RequestHandler } from 'express';
import { AppError } from './errors';

/** No request the app understands nests deeper than this (the body itself is level 1). */
export const MAX_JSON_DEPTH = 64;

/**
 * Whether a parsed JSON value nests arrays and objects deeper than `max`
 * levels. Walks with its own stack instead of recursing, so no depth of input
 * can overflow the call stack, and stops at the first branch that is too deep.
 */
export function nestsDeeperThan(value: unknown, max: number = MAX_JSON_DEPTH): boolean {
  const stack: Array<{ value: unknown; depth: number }> = [{ value, depth: 1 }];
  for (let item = stack.pop(); item; item = stack.pop()) {
    if (typeof item.value !== 'object' || item.value === null) continue;
    if (item.depth > max) return true;
    const children = Array.isArray(item.value) ? item.value : Object.values(item.value);
    for (const child of children) {
      if (typeof child === 'object' && child !== null) stack.push({ value: child, depth: item.depth + 1 });
    }
  }
  return false;
}

/**
 * The same question asked of JSON text as UTF-8 bytes, before it is parsed:
 * one pass over the bytes counting brackets outside strings, with no
 * recursion. Asked first because parsing is the costly part: JSON.parse
 * spends seconds on a few hundred thousand nested brackets (and an 8 MB
 * body holds millions). The brackets, quote and backslash are single bytes
 * that never occur inside a multi-byte UTF-8 character, so bytes suffice.
 */
export function textNestsDeeperThan(bytes: Uint8Array, max: number = MAX_JSON_DEPTH): boolean {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < bytes.length; i += 1) {
    const byte = bytes[i];
    if (inString) {
      if (byte === 0x5c) i += 1; // a backslash: the next byte is escaped, whatever it is
      else if (byte === 0x22) inString = false;
    } else if (byte === 0x22) {
      inString = true;
    } else if (byte === 0x7b || byte === 0x5b) {
      depth += 1;
      if (depth > max) return true;
    } else if (byte === 0x7d || byte === 0x5d) {
      depth -= 1;
    }
  }
  return false;
}

export const tooDeep = () => new AppError('too_deep', `The request body nests deeper than ${MAX_JSON_DEPTH} levels.`, 400);

/**
 * Whether a body's text nests too deep, asked before it is parsed: UTF-8 as
 * it came; UTF-16 decoded first (plain "utf-16" in both byte orders, as the
 * parser may guess either). Any other charset the parser would take (UTF-32)
 * is refused with 415, as it could not be scanned.
 */
function bodyNestsTooDeep(buf: Buffer, encoding: string): boolean {
  if (/^utf-?8$/i.test(encoding)) return textNestsDeeperThan(buf);
  const orders = /^utf-?16$/i.test(encoding) ? ['utf-16le', 'utf-16be'] : [encoding];
  try {
    return orders.some((order) => textNestsDeeperThan(Buffer.from(new TextDecoder(order).decode(buf), 'utf8')));
  } catch {
    throw new AppError('unsupported_charset', 'Send JSON as UTF-8.', 415);
  }
}

const checked = Symbol('json depth checked');
type Checked = { [checked]?: true };

/**
 * express.json with a size limit (too large: 413, bad JSON: 400, both from
 * the error handler) that refuses a body nesting deeper than MAX_JSON_DEPTH
 * with 400 before any route, schema or database sees it (PostgreSQL's jsonb
 * parser, for one, fails on a few thousand levels). UTF-8 text is scanned
 * before JSON.parse runs (body-parser's `verify` hook hands over the raw
 * bytes; an AppError thrown there keeps its status); a UTF-16 body is
 * decoded and scanned the same way, and walked again once parsed.
 */
export function jsonBody(options: { limit: string | number }): RequestHandler[] {
  const parse = express.json({
    limit: options.limit,
    verify: (req, _res, buf, encoding) => {
      if (bodyNestsTooDeep(buf, encoding)) throw tooDeep();
      // UTF-16 is walked once parsed as well, in case the parser read its byte order otherwise.
      if (/^utf-?8$/i.test(encoding)) (req as Checked)[checked] = true;
    },
  });
  const depthCheck: RequestHandler = (req, _res, next) => {
    const flagged = req as typeof req & Checked;
    if (flagged[checked] || req.body === undefined) return next();
    flagged[checked] = true;
    next(nestsDeeperThan(req.body) ? tooDeep() : undefined);
  };
  return [parse, depthCheck];
}
