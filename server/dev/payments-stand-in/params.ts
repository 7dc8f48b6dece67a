import qs from 'qs';
import { invalidParam, invalidRequest, missingParam } from './errors';
import type { Metadata } from './types';

/**
 * The SDK sends every value as a string in bracket notation
 * (`metadata[job_id]=…`, `line_items[0][price_data][unit_amount]=…`, `expand[0]=…`);
 * `null` arrives as an empty string. These helpers turn that back into typed values
 * and answer the provider's 400s when a value does not fit.
 */
export type Params = Record<string, unknown>;

export function parseForm(text: string): Params {
  if (!text) return {};
  return qs.parse(text, { depth: 10, arrayLimit: 1000, parameterLimit: 10_000, allowPrototypes: false }) as Params;
}

/** Stable text for comparing two requests' parameters. */
export function fingerprint(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(fingerprint).join(',')}]`;
  if (value && typeof value === 'object') {
    const entries = Object.keys(value as object)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${fingerprint((value as Record<string, unknown>)[k])}`);
    return `{${entries.join(',')}}`;
  }
  return JSON.stringify(value ?? null);
}

/** Refuses top-level parameters the endpoint does not take, as the provider does. */
export function onlyKnown(params: Params, allowed: readonly string[], prefix = ''): void {
  for (const key of Object.keys(params)) {
    if (!allowed.includes(key)) {
      const name = prefix ? `${prefix}[${key}]` : key;
      throw invalidRequest(`Received unknown parameter: ${name}`, { code: 'parameter_unknown', param: name });
    }
  }
}

const isBlank = (value: unknown) => value === undefined || value === '';

export function optString(value: unknown, param: string): string | undefined {
  if (isBlank(value)) return undefined;
  if (typeof value !== 'string') throw invalidParam(param, `Invalid string: ${JSON.stringify(value)}`);
  return value;
}

export function reqString(value: unknown, param: string): string {
  const text = optString(value, param);
  if (text === undefined) throw missingParam(param);
  return text;
}

export function optInt(value: unknown, param: string, min?: number): number | undefined {
  if (isBlank(value)) return undefined;
  if (typeof value !== 'string' && typeof value !== 'number') throw invalidParam(param, `Invalid integer: ${JSON.stringify(value)}`);
  const text = String(value);
  if (!/^-?\d+$/.test(text)) throw invalidParam(param, `Invalid integer: ${text}`);
  const number = Number(text);
  if (!Number.isSafeInteger(number)) throw invalidParam(param, `Invalid integer: ${text}`);
  if (min !== undefined && number < min) throw invalidParam(param, `Invalid ${param}: must be at least ${min}`);
  return number;
}

export function reqInt(value: unknown, param: string, min?: number): number {
  const number = optInt(value, param, min);
  if (number === undefined) throw missingParam(param);
  return number;
}

export function optBool(value: unknown, param: string): boolean | undefined {
  if (isBlank(value)) return undefined;
  if (value === true || value === 'true') return true;
  if (value === false || value === 'false') return false;
  throw invalidParam(param, `Invalid boolean: ${JSON.stringify(value)}`);
}

export function optObject(value: unknown, param: string): Params | undefined {
  if (isBlank(value)) return undefined;
  if (!value || typeof value !== 'object') throw invalidParam(param, `Invalid object`);
  return value as Params;
}

/** Arrays come as `x[0]=…` (or `x[]=…`); qs may hand back an object keyed by index. */
export function optArray(value: unknown, param: string): unknown[] | undefined {
  if (isBlank(value)) return undefined;
  if (Array.isArray(value)) return value;
  if (value && typeof value === 'object') {
    const keys = Object.keys(value);
    if (keys.every((k) => /^\d+$/.test(k))) {
      return keys.sort((a, b) => Number(a) - Number(b)).map((k) => (value as Record<string, unknown>)[k]);
    }
  }
  throw invalidParam(param, `Invalid array`);
}

export function optCurrency(value: unknown, param: string): string | undefined {
  const text = optString(value, param);
  if (text === undefined) return undefined;
  if (!/^[a-zA-Z]{3}$/.test(text)) throw invalidParam(param, `Invalid currency: ${text}`);
  return text.toLowerCase();
}

export function reqCurrency(value: unknown, param: string): string {
  const currency = optCurrency(value, param);
  if (currency === undefined) throw missingParam(param);
  return currency;
}

/**
 * Metadata as the provider takes it: up to 50 keys, keys up to 40 characters,
 * values up to 500; an empty string as the whole value clears it, an empty
 * value for one key removes that key (on update).
 */
export function metadataParam(value: unknown, param = 'metadata', existing: Metadata = {}): Metadata {
  if (value === undefined) return { ...existing };
  if (value === '') return {};
  if (!value || typeof value !== 'object' || Array.isArray(value)) throw invalidParam(param, 'Invalid metadata: must be an object');
  const next: Metadata = { ...existing };
  for (const [key, raw] of Object.entries(value as Record<string, unknown>)) {
    if (typeof raw !== 'string') throw invalidParam(`${param}[${key}]`, `Invalid metadata value for ${key}`);
    if (key.length > 40) throw invalidParam(`${param}[${key}]`, 'Metadata keys can have a maximum length of 40 characters.');
    if (raw.length > 500) throw invalidParam(`${param}[${key}]`, 'Metadata values can have a maximum length of 500 characters.');
    if (raw === '') delete next[key];
    else next[key] = raw;
  }
  if (Object.keys(next).length > 50) throw invalidParam(param, 'Metadata can have a maximum of 50 keys.');
  return next;
}

export function expandParam(params: Params): string[] {
  const list = optArray(params.expand, 'expand') ?? [];
  return list.map((entry, i) => reqString(entry, `expand[${i}]`));
}

export function oneOf<T extends string>(value: string | undefined, param: string, allowed: readonly T[]): T | undefined {
  if (value === undefined) return undefined;
  if (!(allowed as readonly string[]).includes(value)) {
    throw invalidParam(param, `Invalid ${param}: must be one of ${allowed.join(', ')}`);
  }
  return value as T;
}
