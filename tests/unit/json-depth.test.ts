import { describe, expect, it } from 'vitest';
import { MAX_JSON_DEPTH, nestsDeeperThan, textNestsDeeperThan } from '../../server/lib/json-body';

const deepObject = (depth: number) => JSON.parse('{"a":'.repeat(depth) + '1' + '}'.repeat(depth)) as unknown;
const deepArray = (depth: number) => JSON.parse('['.repeat(depth) + ']'.repeat(depth)) as unknown;

describe('nestsDeeperThan', () => {
  it('when a value nests exactly to the limit, then it passes; one level more does not', () => {
    expect(nestsDeeperThan(deepObject(MAX_JSON_DEPTH))).toBe(false);
    expect(nestsDeeperThan(deepObject(MAX_JSON_DEPTH + 1))).toBe(true);
    expect(nestsDeeperThan(deepArray(MAX_JSON_DEPTH))).toBe(false);
    expect(nestsDeeperThan(deepArray(MAX_JSON_DEPTH + 1))).toBe(true);
  });

  it('when a value is 100,000 levels deep, then the check answers without overflowing the stack', () => {
    expect(nestsDeeperThan(deepArray(100_000))).toBe(true);
    expect(nestsDeeperThan(deepObject(100_000))).toBe(true);
  });

  it('when a value is wide but shallow, or not an object at all, then it passes', () => {
    expect(nestsDeeperThan({ heights: Array.from({ length: 200_000 }, (_, i) => i), cylinders: [{ top: { thrust: 4.031 } }] })).toBe(false);
    for (const value of [null, 1, 'text', true, [], {}]) expect(nestsDeeperThan(value)).toBe(false);
  });

  it('when only one branch among shallow ones is too deep, then it is found', () => {
    expect(nestsDeeperThan({ a: [1, 2, { b: 3 }], c: { d: deepArray(MAX_JSON_DEPTH) } })).toBe(true);
  });
});

describe('textNestsDeeperThan (JSON text, before parsing)', () => {
  const bytes = (text: string) => Buffer.from(text, 'utf8');
  const objectText = (depth: number) => '{"a":'.repeat(depth) + '1' + '}'.repeat(depth);

  it('when the text nests exactly to the limit, then it passes; one level more does not', () => {
    expect(textNestsDeeperThan(bytes(objectText(MAX_JSON_DEPTH)))).toBe(false);
    expect(textNestsDeeperThan(bytes(objectText(MAX_JSON_DEPTH + 1)))).toBe(true);
    expect(textNestsDeeperThan(bytes('['.repeat(MAX_JSON_DEPTH + 1) + ']'.repeat(MAX_JSON_DEPTH + 1)))).toBe(true);
  });

  it('when brackets are inside strings, escaped quotes and backslashes included, then they do not count', () => {
    const inside = JSON.stringify({ notes: '['.repeat(500) + '\\"{{{' + '{'.repeat(500), cite: 'a \\', more: '"[[[["' });
    expect(textNestsDeeperThan(bytes(inside))).toBe(false);
    expect(textNestsDeeperThan(bytes(JSON.stringify({ text: 'é ü 😀 ['.repeat(200) })))).toBe(false);
    // The same brackets outside the strings do count.
    expect(textNestsDeeperThan(bytes(`{"notes":"\\\\",${'"x":['.repeat(70)}1${']'.repeat(70)}}`))).toBe(true);
  });

  it('when the text is 8 MB of brackets, then the scan answers without recursion', () => {
    expect(textNestsDeeperThan(Buffer.alloc(8 * 1024 * 1024, '['))).toBe(true);
    expect(textNestsDeeperThan(Buffer.alloc(8 * 1024 * 1024, '"'))).toBe(false);
  });
});
