/**
 * The shared base of every PDF Bellwether generates on the server (evidence packs, worker letters):
 * an A4 pdfkit document with Noto Sans embedded (PRODUCT.md "Look and feel": Noto Sans, shipped with
 * the app), fixed metadata so the same input always gives the same bytes, a running header and footer
 * (organization, title, "page x of y"), and small layout helpers: headings, paragraphs, label/value
 * lines, a table that repeats its header on a page break, and a caution box.
 *
 * Usage:
 *   const doc = createPdfDocument({ title, organizationName, createdAt });
 *   heading(doc, 'Summary'); paragraph(doc, '…'); table(doc, columns, rows); cautionBox(doc, cautions);
 *   const bytes = await documentToBuffer(doc);   // draws header/footer on every page, then ends the document
 *
 * Why pdfkit: docs/decisions/020-evidence-pack.md.
 */
import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';

const require = createRequire(import.meta.url);

/** Noto Sans (Latin subset, WOFF) from @fontsource/noto-sans; pdfkit's fontkit reads WOFF and embeds a subset. */
const fontFiles = {
  regular: require.resolve('@fontsource/noto-sans/files/noto-sans-latin-400-normal.woff'),
  bold: require.resolve('@fontsource/noto-sans/files/noto-sans-latin-700-normal.woff'),
} as const;

/** Font names registered on every document. */
export const fonts = { regular: 'NotoSans', bold: 'NotoSans-Bold' } as const;

/** Colours shared by the PDFs (ink, muted text, rules, caution box), in sRGB hex. */
export const pdfColours = {
  ink: '#1f2933',
  muted: '#52606d',
  rule: '#cbd2d9',
  tableHeader: '#e6edf0',
  tableStripe: '#f5f7f8',
  cautionFill: '#fff6e0',
  cautionBorder: '#b7791f',
  accent: '#1c6a7d',
} as const;

/** A4 in PDF points, and the margins that leave room for the running header and footer. */
export const pageSize = { width: 595.28, height: 841.89 } as const;
export const pageMargins = { top: 64, bottom: 60, left: 50, right: 50 } as const;

export interface PdfDocumentOptions {
  /** Document title (metadata and running header). */
  title: string;
  /** Organization named in the running header. */
  organizationName: string;
  /** Creation date written in the metadata; pass a fixed date (e.g. the record's approval) for reproducible output. */
  createdAt: Date;
  subject?: string;
  keywords?: string;
}

type Doc = PDFKit.PDFDocument;

/**
 * The embedded Latin subset has no glyphs for a few symbols the product writes (→, ≥, ≤, ≈, Greek letters); they
 * would vanish from the page. The helpers below pass every text through this spelling-out first.
 */
const spelledOut: ReadonlyArray<readonly [RegExp, string]> = [
  [/→/g, '->'],
  [/←/g, '<-'],
  [/≥/g, '>='],
  [/≤/g, '<='],
  [/≈/g, '~'],
  [/≠/g, '!='],
  [/×/g, 'x'],
  [/⁻¹/g, '^-1'],
  [/ᵢ/g, '_i'],
  [/ȳ/g, 'y-bar'],
  // Greek letters (method notes write μ, σ, Φ): the Latin subset has none, so they are spelled out.
  ...Object.entries({
    α: 'alpha',
    β: 'beta',
    γ: 'gamma',
    δ: 'delta',
    ε: 'epsilon',
    θ: 'theta',
    λ: 'lambda',
    μ: 'mu',
    π: 'pi',
    ρ: 'rho',
    σ: 'sigma',
    τ: 'tau',
    φ: 'phi',
    χ: 'chi',
    ψ: 'psi',
    ω: 'omega',
    Δ: 'Delta',
    Φ: 'Phi',
    Σ: 'Sum',
    Ω: 'Omega',
  }).map(([letter, name]) => [new RegExp(letter, 'g'), name] as const),
];

/** Text as the embedded font can print it (symbols outside the Latin subset spelled out). */
export function printable(text: string): string {
  return spelledOut.reduce((result, [pattern, replacement]) => result.replace(pattern, replacement), text);
}

const documentOptions = new WeakMap<Doc, PdfDocumentOptions>();

/** A new A4 document with Noto Sans registered and selected, metadata set, and pages buffered for the footer. */
export function createPdfDocument(options: PdfDocumentOptions): Doc {
  const doc = new PDFDocument({
    size: 'A4',
    margins: { ...pageMargins },
    bufferPages: true,
    autoFirstPage: true,
    // Uncompressed content would make the files large; compression is deterministic (zlib).
    compress: true,
    info: {
      Title: options.title,
      Author: 'Bellwether',
      Creator: 'Bellwether',
      Producer: 'Bellwether (pdfkit)',
      Subject: options.subject ?? options.title,
      Keywords: options.keywords ?? '',
      CreationDate: options.createdAt,
      ModDate: options.createdAt,
    },
    lang: 'en',
    displayTitle: true,
  });
  doc.registerFont(fonts.regular, fontFiles.regular);
  doc.registerFont(fonts.bold, fontFiles.bold);
  doc.font(fonts.regular).fontSize(10).fillColor(pdfColours.ink);
  documentOptions.set(doc, options);
  return doc;
}

/** The width available between the side margins. */
export function contentWidth(doc: Doc): number {
  return doc.page.width - doc.page.margins.left - doc.page.margins.right;
}

/** The lowest y content may reach on the current page. */
export function contentBottom(doc: Doc): number {
  return doc.page.height - doc.page.margins.bottom;
}

/** Start a new page unless `height` points still fit below the cursor. */
export function ensureSpace(doc: Doc, height: number): void {
  if (doc.y + height > contentBottom(doc)) doc.addPage();
}

/** A heading: level 1 (document title, 18 pt), 2 (section, 13 pt) or 3 (sub-section, 11 pt); kept with the next lines. */
export function heading(doc: Doc, text: string, level: 1 | 2 | 3 = 2): void {
  const size = level === 1 ? 18 : level === 2 ? 13 : 11;
  ensureSpace(doc, size * 4);
  if (level > 1 && doc.y > doc.page.margins.top + 1) doc.moveDown(0.6);
  doc
    .font(fonts.bold)
    .fontSize(size)
    .fillColor(level === 1 ? pdfColours.ink : pdfColours.accent)
    .text(printable(text), doc.page.margins.left, doc.y, { width: contentWidth(doc) });
  doc.moveDown(0.3);
  doc.font(fonts.regular).fontSize(10).fillColor(pdfColours.ink);
}

/** A paragraph of body text (10 pt unless given), full width, followed by a small gap. */
export function paragraph(doc: Doc, text: string, options: { size?: number; colour?: string; bold?: boolean } = {}): void {
  doc
    .font(options.bold ? fonts.bold : fonts.regular)
    .fontSize(options.size ?? 10)
    .fillColor(options.colour ?? pdfColours.ink)
    .text(printable(text), doc.page.margins.left, doc.y, { width: contentWidth(doc), lineGap: 1.5 });
  doc.moveDown(0.4);
  doc.font(fonts.regular).fontSize(10).fillColor(pdfColours.ink);
}

/** Label/value lines ("Approved by: …"), the label in bold in a fixed column. */
export function labelledLines(doc: Doc, lines: ReadonlyArray<readonly [label: string, value: string]>, labelWidth = 150): void {
  const left = doc.page.margins.left;
  const valueWidth = contentWidth(doc) - labelWidth;
  for (const [rawLabel, rawValue] of lines) {
    const label = printable(rawLabel);
    const value = printable(rawValue);
    doc.font(fonts.regular).fontSize(10);
    const height = Math.max(doc.heightOfString(value, { width: valueWidth }), doc.heightOfString(label, { width: labelWidth - 8 }));
    ensureSpace(doc, height + 2);
    const top = doc.y;
    doc
      .font(fonts.bold)
      .fillColor(pdfColours.muted)
      .text(label, left, top, { width: labelWidth - 8 });
    doc
      .font(fonts.regular)
      .fillColor(pdfColours.ink)
      .text(value, left + labelWidth, top, { width: valueWidth });
    doc.y = top + height + 2;
  }
  doc.x = left;
  doc.moveDown(0.3);
}

/** One column of a table: header text, width in points, alignment. */
export interface TableColumn {
  header: string;
  width: number;
  align?: 'left' | 'right' | 'center';
}

const cellPadding = 3;

function rowHeight(doc: Doc, columns: readonly TableColumn[], cells: readonly string[]): number {
  return (
    Math.max(...columns.map((column, index) => doc.heightOfString(printable(cells[index] ?? ''), { width: column.width - 2 * cellPadding }))) + 2 * cellPadding
  );
}

function drawRow(doc: Doc, columns: readonly TableColumn[], cells: readonly string[], top: number, height: number, fill: string | null): void {
  const left = doc.page.margins.left;
  const width = columns.reduce((sum, column) => sum + column.width, 0);
  if (fill) doc.save().rect(left, top, width, height).fill(fill).restore();
  let x = left;
  columns.forEach((column, index) => {
    doc.fillColor(pdfColours.ink).text(printable(cells[index] ?? ''), x + cellPadding, top + cellPadding, {
      width: column.width - 2 * cellPadding,
      align: column.align ?? 'left',
      lineBreak: true,
    });
    x += column.width;
  });
  doc
    .save()
    .moveTo(left, top + height)
    .lineTo(left + width, top + height)
    .lineWidth(0.5)
    .strokeColor(pdfColours.rule)
    .stroke()
    .restore();
}

/**
 * A simple table (9 pt): a bold header row on a tinted band, then the rows, striped. A row never
 * splits across pages; when the next row does not fit, a new page starts and the header is repeated.
 */
export function table(doc: Doc, columns: readonly TableColumn[], rows: ReadonlyArray<readonly string[]>, options: { size?: number } = {}): void {
  const size = options.size ?? 9;
  const header = columns.map((column) => column.header);
  const drawHeader = () => {
    doc.font(fonts.bold).fontSize(size);
    const height = rowHeight(doc, columns, header);
    const top = doc.y;
    drawRow(doc, columns, header, top, height, pdfColours.tableHeader);
    doc.y = top + height;
    doc.font(fonts.regular).fontSize(size);
  };
  doc.font(fonts.bold).fontSize(size);
  const headerHeight = rowHeight(doc, columns, header);
  doc.font(fonts.regular).fontSize(size);
  ensureSpace(doc, headerHeight + (rows[0] ? rowHeight(doc, columns, rows[0]) : 0));
  drawHeader();
  rows.forEach((cells, index) => {
    const height = rowHeight(doc, columns, cells);
    if (doc.y + height > contentBottom(doc)) {
      doc.addPage();
      drawHeader();
    }
    const top = doc.y;
    drawRow(doc, columns, cells, top, height, index % 2 === 1 ? pdfColours.tableStripe : null);
    doc.y = top + height;
  });
  doc.x = doc.page.margins.left;
  doc.moveDown(0.6);
  doc.font(fonts.regular).fontSize(10).fillColor(pdfColours.ink);
}

/** A boxed, tinted list of cautions under a bold title ("Cautions"); kept on one page when it fits. */
export function cautionBox(doc: Doc, lines: readonly string[], title = 'Cautions'): void {
  const left = doc.page.margins.left;
  const width = contentWidth(doc);
  const inner = width - 20;
  doc.font(fonts.regular).fontSize(9.5);
  const bodies = lines.map((line) => `• ${printable(line)}`);
  const bodyHeight = bodies.reduce((sum, line) => sum + doc.heightOfString(line, { width: inner, lineGap: 1 }) + 3, 0);
  const height = bodyHeight + 34;
  ensureSpace(doc, Math.min(height, contentBottom(doc) - doc.page.margins.top));
  const top = doc.y;
  doc.save().rect(left, top, width, height).fillAndStroke(pdfColours.cautionFill, pdfColours.cautionBorder).restore();
  doc
    .font(fonts.bold)
    .fontSize(10.5)
    .fillColor(pdfColours.ink)
    .text(title, left + 10, top + 9, { width: inner });
  doc.font(fonts.regular).fontSize(9.5);
  let y = top + 27;
  for (const line of bodies) {
    doc.text(line, left + 10, y, { width: inner, lineGap: 1 });
    y = doc.y + 3;
  }
  doc.x = left;
  doc.y = Math.max(doc.y, top + height) + 8;
  doc.fontSize(10);
}

/** Draw the running header (organization · title) and footer (generated-by note · page x of y) on every buffered page. */
function decoratePages(doc: Doc, options: PdfDocumentOptions): void {
  const range = doc.bufferedPageRange();
  for (let index = range.start; index < range.start + range.count; index += 1) {
    doc.switchToPage(index);
    // Writing inside the margins would make pdfkit add a page; lift the bottom margin while decorating.
    const bottomMargin = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const left = doc.page.margins.left;
    const width = contentWidth(doc);
    doc.font(fonts.regular).fontSize(8).fillColor(pdfColours.muted);
    doc.text(printable(options.organizationName), left, 28, { width: width / 2, lineBreak: false });
    doc.text(printable(options.title), left + width / 2, 28, { width: width / 2, align: 'right', lineBreak: false });
    doc
      .moveTo(left, 42)
      .lineTo(left + width, 42)
      .lineWidth(0.5)
      .strokeColor(pdfColours.rule)
      .stroke();
    const footerY = doc.page.height - 40;
    doc.text(`Generated by Bellwether · ${options.createdAt.toISOString().slice(0, 10)}`, left, footerY, { width: width / 2, lineBreak: false });
    doc.text(`Page ${index - range.start + 1} of ${range.count}`, left + width / 2, footerY, { width: width / 2, align: 'right', lineBreak: false });
    doc.page.margins.bottom = bottomMargin;
  }
}

/** Add the header and footer to every page, end the document and collect its bytes. */
export function documentToBuffer(doc: Doc): Promise<Buffer> {
  const options = documentOptions.get(doc);
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    doc.on('data', (chunk: Buffer) => chunks.push(chunk));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    try {
      if (options) decoratePages(doc, options);
      doc.end();
    } catch (error) {
      reject(error instanceof Error ? error : new Error(String(error)));
    }
  });
}
