import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { centsToDollars, dollarsFormResolver, MONEY_MESSAGES, parseDollars, tidyDollars } from '../../client/lib/money';

describe('dollars typed into a form', () => {
  it.each([
    ['12.3', 1230],
    ['12.30', 1230],
    ['12', 1200],
    ['12.', 1200],
    ['0.1', 10],
    ['.75', 75],
    ['0', 0],
    ['007.05', 705],
    ['$45', 4500],
    [' $ 45.50 ', 4550],
    ['1,250.50', 125050],
    ['1,000,000', 100_000_000],
    // 0.29 * 100 is 28.999999999999996 in floating point; read digit by digit it is exactly 29 cents
    ['0.29', 29],
    ['1.15', 115],
    ['4.35', 435],
  ])('when "%s" is typed, then it is %i cents exactly', (text, cents) => {
    expect(parseDollars(text)).toEqual({ ok: true, cents });
  });

  it.each([
    ['', MONEY_MESSAGES.empty],
    ['   ', MONEY_MESSAGES.empty],
    ['12.345', MONEY_MESSAGES.tooManyDecimals],
    ['0.001', MONEY_MESSAGES.tooManyDecimals],
    ['-5', MONEY_MESSAGES.negative],
    ['−5', MONEY_MESSAGES.negative],
    ['abc', MONEY_MESSAGES.notANumber],
    ['.', MONEY_MESSAGES.notANumber],
    ['1e3', MONEY_MESSAGES.notANumber],
    ['12,34', MONEY_MESSAGES.notANumber],
    ['1.2.3', MONEY_MESSAGES.notANumber],
    ['9999999999999', MONEY_MESSAGES.tooLarge],
  ])('when "%s" is typed, then it is refused: %s', (text, message) => {
    expect(parseDollars(text)).toEqual({ ok: false, message });
  });

  it('when cents are written as dollars text, then reading the text back gives the same cents', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 100_000_000_000 }), (cents) => {
        expect(parseDollars(centsToDollars(cents))).toEqual({ ok: true, cents });
      }),
    );
    expect(centsToDollars(123450)).toBe('1234.50');
    expect(centsToDollars(5)).toBe('0.05');
    expect(centsToDollars(0)).toBe('0.00');
    expect(() => centsToDollars(1.5)).toThrow();
  });

  it('when a dollars input is left, then a readable amount is written back plainly and anything else stays as typed', () => {
    const tidied = (text: string) => {
      let written = text;
      tidyDollars({ target: { value: text } }, (value) => (written = value));
      return written;
    };
    expect(tidied('$1,250')).toBe('1250.00');
    expect(tidied('12.3')).toBe('12.30');
    expect(tidied('12.345')).toBe('12.345');
    expect(tidied('')).toBe('');
  });

  it('when any dollars-and-cents text is read, then it equals whole dollars times 100 plus the cents digits', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 9_999_999 }), fc.integer({ min: 0, max: 99 }), (dollars, cents) => {
        expect(parseDollars(`${dollars}.${String(cents).padStart(2, '0')}`)).toEqual({ ok: true, cents: dollars * 100 + cents });
      }),
    );
  });
});

describe('a form resolver for dollars fields checked by a shared schema', () => {
  const schema = z.object({
    lines: z.array(z.object({ priceCents: z.number().int().min(0).max(1000, 'At most $10.') })).min(1, 'Add a line.'),
  });
  type Form = { lines: Array<{ price: string }> };
  const resolver = dollarsFormResolver<Form, z.infer<typeof schema>>(() => Promise.resolve(schema), (values) => {
    const moneyErrors: Record<string, string> = {};
    const lines = values.lines.map((line, index) => {
      const parsed = parseDollars(line.price);
      if (!parsed.ok) moneyErrors[`lines.${index}.price`] = parsed.message;
      return { priceCents: parsed.ok ? parsed.cents : Number.NaN };
    });
    return { input: { lines }, moneyErrors, formPath: (path) => path.replace(/\.priceCents$/, '.price') };
  });
  const run = (values: Form) => resolver(values, undefined, { fields: {}, shouldUseNativeValidation: false });

  it('when every amount reads, then the form submits the schema’s output in cents', async () => {
    await expect(run({ lines: [{ price: '4.35' }] })).resolves.toEqual({ values: { lines: [{ priceCents: 435 }] }, errors: {} });
  });

  it('when an amount has three decimals, then the money message sits on that dollars field, not the schema’s', async () => {
    const result = await run({ lines: [{ price: '1' }, { price: '12.345' }] });
    expect(result.values).toEqual({});
    expect((result.errors as any).lines[1].price.message).toBe(MONEY_MESSAGES.tooManyDecimals);
    expect((result.errors as any).lines[0]).toBeUndefined();
  });

  it('when the schema refuses a readable amount, then its own message goes beside the dollars field', async () => {
    const result = await run({ lines: [{ price: '10.01' }] });
    expect((result.errors as any).lines[0].price.message).toBe('At most $10.');
  });
});
