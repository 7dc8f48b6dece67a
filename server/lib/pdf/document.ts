import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import { formatCents } from '../../../shared/catalogue';
import { formatDateTime, SERVER_TIME_ZONE } from '../../../shared/dates';

/**
 * The frame every document Tenthmark prints shares (inspection certificate,
 * receipt, invoice, quote): A4, Manrope embedded, a heading in Tenthmark's
 * name, a footer, and money written one way.
 *
 * Manrope, the product's typeface: the web font package (@fontsource/manrope)
 * ships it cut into subsets whose Latin part has no ≤ or ≥, so the PDF uses
 * the same Manrope (version 4.504) uncut, as TrueType files from
 * @expo-google-fonts/manrope: ≤, ±, µ, °, − and € all print as text.
 */
const require = createRequire(import.meta.url);
let fonts: { regular: Buffer; bold: Buffer } | undefined;
function manrope() {
  fonts ??= {
    regular: readFileSync(require.resolve('@expo-google-fonts/manrope/400Regular/Manrope_400Regular.ttf')),
    bold: readFileSync(require.resolve('@expo-google-fonts/manrope/700Bold/Manrope_700Bold.ttf')),
  };
  return fonts;
}

const INK = '#16232d';
const ACCENT = '#1d4e6b';
const QUIET = '#5d6b75';

/** Money on a document: whole cents written in the payment's currency. */
export const money = (cents: number, currency = 'usd') => formatCents(cents, currency.toUpperCase(), 'en-US');

/** A moment on a document: minutes, in UTC, said so ("5 Dec 2026, 14:03 UTC"). */
export const stamp = (at: Date) => formatDateTime(at, SERVER_TIME_ZONE);

export interface PrintedDocument {
  doc: PDFKit.PDFDocument;
  /** A section heading. */
  heading(text: string): void;
  /** A line of body text. */
  line(text: string): void;
  /** A "label … value" row, the value right-aligned (line items, totals). */
  row(label: string, value: string, options?: { bold?: boolean }): void;
  /** Small grey text at the end (the guidance caution, what a document is and is not). */
  footnote(text: string): void;
  /** Finishes the document and resolves to its bytes. */
  finish(): Promise<Buffer>;
}

/**
 * Starts a document: the title in Tenthmark's accent colour, the body font
 * set, and every page footed with Tenthmark's name and the page number.
 */
export function startDocument(meta: { title: string; author: string; heading: string }): PrintedDocument {
  const font = manrope();
  const doc = new PDFDocument({ size: 'A4', margin: 48, bufferPages: true, info: { Title: meta.title, Author: meta.author, Creator: 'Tenthmark' } });
  const chunks: Buffer[] = [];
  doc.registerFont('Body', font.regular);
  doc.registerFont('Body-Bold', font.bold);
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  doc.font('Body-Bold').fontSize(18).fillColor(ACCENT).text(meta.heading);
  doc.font('Body').fontSize(10).fillColor(INK);

  const width = () => doc.page.width - doc.page.margins.left - doc.page.margins.right;
  return {
    doc,
    heading: (text) => {
      doc.moveDown(0.8).font('Body-Bold').fontSize(12).fillColor(ACCENT).text(text).fillColor(INK).font('Body').fontSize(9.5);
    },
    line: (text) => {
      doc.text(text);
    },
    row: (label, value, options = {}) => {
      const y = doc.y;
      const left = doc.page.margins.left;
      doc.font(options.bold ? 'Body-Bold' : 'Body');
      doc.text(label, left, y, { width: width() - 120 });
      const below = doc.y;
      doc.text(value, left + width() - 120, y, { width: 120, align: 'right' });
      doc.x = left;
      doc.y = Math.max(below, doc.y);
      doc.font('Body');
    },
    footnote: (text) => {
      doc.moveDown(1).fontSize(8.5).fillColor(QUIET).text(text).fillColor(INK).fontSize(9.5);
    },
    finish: () => {
      const pages = doc.bufferedPageRange();
      for (let i = 0; i < pages.count; i += 1) {
        doc.switchToPage(pages.start + i);
        const bottom = doc.page.margins.bottom;
        doc.page.margins.bottom = 0;
        doc
          .font('Body')
          .fontSize(8)
          .fillColor(QUIET)
          .text(`Tenthmark · ${meta.title} · page ${i + 1} of ${pages.count}`, doc.page.margins.left, doc.page.height - 32, { width: width(), align: 'center', lineBreak: false });
        doc.page.margins.bottom = bottom;
      }
      doc.end();
      return done;
    },
  };
}
