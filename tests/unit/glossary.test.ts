import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import ts from 'typescript';
import { beforeAll, describe, expect, it } from 'vitest';
import { bidStatus, disputeStatus, inspectionStatus, jobStatus, paymentStatus, changeOrderStatus } from '../../server/db/schema';
import {
  BID_STATUS,
  DISPUTE_STATUS,
  EXTRA_WORK_STATUS,
  HOME_PAGE_NAMES,
  homePageName,
  homePageTitle,
  JOB_STATUS,
  PAYMENT_STATUS,
  RECORD_STATUS,
  RETIRED_NAMES,
  type Term,
} from '../../shared/glossary';
import { bidStatuses } from '../../shared/schemas/bids';
import { jobStatuses } from '../../shared/schemas/jobs';

const root = join(import.meta.dirname, '..', '..');

/** Every status kind: the database's enum values beside the glossary's names for them. */
const kinds: Array<[string, readonly string[], Readonly<Record<string, Term>>]> = [
  ['job', jobStatus.enumValues, JOB_STATUS],
  ['bid', bidStatus.enumValues, BID_STATUS],
  ['inspection record', inspectionStatus.enumValues, RECORD_STATUS],
  ['dispute', disputeStatus.enumValues, DISPUTE_STATUS],
  ['payment', paymentStatus.enumValues, PAYMENT_STATUS],
  ['extra work', changeOrderStatus.enumValues, EXTRA_WORK_STATUS],
];

describe('the glossary names every status once', () => {
  it.each(kinds)('every %s status in the database has a name, and the glossary names no other', (_kind, values, terms) => {
    expect(Object.keys(terms).sort()).toEqual([...values].sort());
    for (const value of values) expect(terms[value]!.label.trim()).not.toBe('');
  });

  it.each(kinds)('no two %s statuses share a name', (_kind, _values, terms) => {
    const labels = Object.values(terms).map((term) => term.label.toLowerCase());
    expect(new Set(labels).size).toBe(labels.length);
  });

  it('the schemas the API answers with list the same job and bid statuses as the database', () => {
    expect([...jobStatuses]).toEqual(jobStatus.enumValues);
    expect([...bidStatuses]).toEqual(bidStatus.enumValues);
  });

  it('each home page has one name: the menu’s, the heading’s and a link’s are the same words', () => {
    expect([homePageTitle('builder'), homePageName('builder'), HOME_PAGE_NAMES.builder]).toEqual(['Your workbench', 'your workbench', 'Workbench']);
    expect([homePageTitle('shop'), homePageName('shop'), HOME_PAGE_NAMES.shop]).toEqual(['Your shop floor', 'your shop floor', 'Shop floor']);
    expect(homePageTitle('admin')).toBe(HOME_PAGE_NAMES.admin);
    expect(homePageName(undefined)).toBe('your home page');
  });

  it('an awarded job whose payment is due does not look like a completed one', () => {
    // The issue: "Awarded" (payment still due) had the same green as "Completed".
    expect(JOB_STATUS.awarded.tone).toBe('warning');
    expect(JOB_STATUS.completed.tone).toBe('success');
    expect(JOB_STATUS.awarded.label).toMatch(/payment due/i);
  });
});

// --- retired names --------------------------------------------------------------

function filesUnder(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return filesUnder(path);
    return /\.tsx?$/.test(name) ? [path] : [];
  });
}

/** Where people read Tenthmark's words: every screen, every e-mail and notice, the PDFs, and the shared words. */
const wordFiles = [
  ...filesUnder(join(root, 'client')),
  ...filesUnder(join(root, 'server', 'lib', 'mail')),
  ...filesUnder(join(root, 'server', 'modules')).filter((path) => /\.(service|pdf)\.ts$|notifications/.test(path)),
  ...filesUnder(join(root, 'shared')).filter((path) => !path.endsWith('glossary.ts')),
];

/**
 * A literal only when people may read it: text in JSX, and strings that are
 * not a code word (an enum value, a query key, a path or a CSS class is all
 * lower case with no space: `'milestone'`, `'/dashboard'`). Property names,
 * import paths and types are code, never read.
 */
function readableTexts(path: string): Array<{ line: number; text: string }> {
  const source = ts.createSourceFile(path, readFileSync(path, 'utf8'), ts.ScriptTarget.Latest, true, path.endsWith('x') ? ts.ScriptKind.TSX : ts.ScriptKind.TS);
  const found: Array<{ line: number; text: string }> = [];
  const codeWord = /^[a-z0-9_./:#?=&[\]-]*$/;
  const visit = (node: ts.Node) => {
    const parent = node.parent;
    let text: string | undefined;
    if (ts.isJsxText(node)) text = node.text;
    else if (ts.isStringLiteral(node) || ts.isNoSubstitutionTemplateLiteral(node) || ts.isTemplateHead(node) || ts.isTemplateMiddle(node) || ts.isTemplateTail(node)) {
      const isName = parent && (ts.isPropertyAssignment(parent) || ts.isPropertySignature(parent)) && parent.name === node;
      const isCode = parent && (ts.isImportDeclaration(parent) || ts.isExportDeclaration(parent) || ts.isLiteralTypeNode(parent) || ts.isExternalModuleReference(parent));
      if (!isName && !isCode) text = node.text;
    }
    if (text !== undefined && text.trim() !== '' && !codeWord.test(text.trim())) {
      found.push({ line: source.getLineAndCharacterOfPosition(node.getStart()).line + 1, text });
    }
    ts.forEachChild(node, visit);
  };
  visit(source);
  return found;
}

/** Every readable text of every file, read once (parsing some two hundred files takes seconds on a busy machine). */
let allTexts: Array<{ path: string; line: number; text: string }> | undefined;
const textsEverywhere = () => (allTexts ??= wordFiles.flatMap((path) => readableTexts(path).map((t) => ({ path, ...t }))));

describe('retired names stay retired', () => {
  beforeAll(() => void textsEverywhere(), 120_000);

  it('finds texts people read, and passes over code words', () => {
    // The check must see what it is meant to see: a label, a JSX text, and not an enum value or a path.
    const path = join(root, 'client', 'app', 'layout.tsx');
    const texts = readableTexts(path).map((t) => t.text);
    expect(texts).toContain('Shops');
    expect(texts).not.toContain('/dashboard');
    expect(wordFiles.length).toBeGreaterThan(100);
  });

  it.each(RETIRED_NAMES.map(({ retired, use }) => [String(retired), retired, use] as const))('no screen, e-mail or notice says %s', (_name, retired, use) => {
    const hits = textsEverywhere()
      .filter(({ text }) => retired.test(text))
      .map(({ path, line, text }) => `${relative(root, path)}:${line}: “${text.trim()}” (say “${use}”)`);
    expect(hits).toEqual([]);
  });
});
