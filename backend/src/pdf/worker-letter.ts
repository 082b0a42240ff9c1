import type { WorkerLetterContent } from '@schema/worker-letters';
import { cautionBox, contentWidth, createPdfDocument, documentToBuffer, heading, labelledLines, paragraph, pdfColours, table } from './document';

/**
 * A worker letter as a PDF (A4, Noto Sans, the shared layout of pdf/document.ts), rendered from the
 * letter's stored content only, so the same letter always gives the same words. The creation date
 * is the drafting time, which keeps the bytes reproducible (docs/decisions/024-worker-letters.md).
 */
export async function workerLetterPdf(content: WorkerLetterContent, draftedAt: Date): Promise<Buffer> {
  const doc = createPdfDocument({
    title: 'Exposure result letter',
    organizationName: content.organizationName,
    createdAt: draftedAt,
    subject: content.subject,
    keywords: 'worker notification, exposure monitoring',
  });
  heading(doc, content.subject, 1);
  const recipient = content.recipient.name ? `${content.recipient.name} (worker ${content.recipient.code})` : `Worker ${content.recipient.code}`;
  labelledLines(
    doc,
    [
      ['To', content.recipient.jobTitle ? `${recipient}, ${content.recipient.jobTitle}` : recipient],
      ['Date', content.letterDate],
      ['From', `${content.contact.name} (${content.contact.email}), ${content.organizationName}`],
      ['Exposure group', `${content.group.name} (${content.group.agentName})`],
    ],
    110,
  );
  paragraph(doc, content.greeting);
  heading(doc, 'Your result');
  paragraph(doc, content.introduction);
  const width = contentWidth(doc);
  table(
    doc,
    [
      { header: 'Shift date', width: width * 0.2 },
      { header: 'Your result', width: width * 0.35 },
      { header: `Compared with the action level (${content.actionLevel.text}) and the limit (${content.limit.text})`, width: width * 0.45 },
    ],
    content.results.map((result) => [result.date, result.valueText, result.comparison]),
    { size: 9.5 },
  );
  for (const section of content.sections) {
    heading(doc, section.heading);
    for (const text of section.paragraphs) paragraph(doc, text);
  }
  doc.moveDown(0.5);
  for (const line of content.closing.split('\n')) paragraph(doc, line, { colour: pdfColours.ink });
  doc.moveDown(0.5);
  cautionBox(doc, content.cautions);
  return documentToBuffer(doc);
}
