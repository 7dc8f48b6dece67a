import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { csvDecimal, csvStringifier } from '../../server/lib/csv';

/** Every cell written through the shared stringifier, read back as text. */
async function roundTrip(rows: unknown[][]): Promise<string[][]> {
  const csv = csvStringifier();
  const chunks: string[] = [];
  csv.on('data', (chunk: Buffer | string) => chunks.push(chunk.toString()));
  for (const row of rows) csv.write(row);
  await new Promise<void>((resolve) => csv.end(resolve));
  return parse(chunks.join(''), { relax_column_count: true }) as string[][];
}

describe('spreadsheet-safe CSV cells', () => {
  it.each([
    ['=HYPERLINK("http://elsewhere.example/","Open")', `'=HYPERLINK("http://elsewhere.example/","Open")`],
    ['+1+1', `'+1+1`],
    ['-2+3', `'-2+3`],
    ['@SUM(1)', `'@SUM(1)`],
    ['\t=1+1', `'\t=1+1`],
    ['\r=1+1', `'\r=1+1`],
  ])('when a text cell begins %j, then it is written behind a single quote', async (text, expected) => {
    expect(await roundTrip([[text]])).toEqual([[expected]]);
  });

  it('when a text cell begins with anything else, then it is written unchanged', async () => {
    const texts = ['Bore and hone a V8 block', 'a=b', "O'Quernfield", '', ' =1', '1-2', 'ch_3Ab=c'];
    expect(await roundTrip([texts])).toEqual([texts]);
  });

  it('when the app writes numbers, negative ones included, then they are written as numbers', async () => {
    expect(await roundTrip([[1500, -1500, 0, -0.5, csvDecimal(-15, 2), csvDecimal(1234.5, 2)]])).toEqual([['1500', '-1500', '0', '-0.5', '-15.00', '1234.50']]);
  });

  it('when the stringifier writes its header row, then the header names are written as given', async () => {
    const csv = csvStringifier({ header: true, columns: ['id', 'amount'] });
    const chunks: string[] = [];
    csv.on('data', (chunk: Buffer | string) => chunks.push(chunk.toString()));
    csv.write([1, '-5']);
    await new Promise<void>((resolve) => csv.end(resolve));
    expect(parse(chunks.join(''))).toEqual([
      ['id', 'amount'],
      ['1', `'-5`],
    ]);
  });
});
