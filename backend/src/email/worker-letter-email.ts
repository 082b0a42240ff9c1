import type { WorkerLetterContent } from '@schema/worker-letters';
import { letterPlainText } from '../services/worker-letter-content';
import type { MailMessage } from './mailer';
import { escapeHtml } from './templates';

/** File name of a letter's PDF, e.g. `exposure-letter-RT-001-2025-03-10.pdf`. */
export function workerLetterFileName(content: WorkerLetterContent): string {
  const code = content.recipient.code.replace(/[^A-Za-z0-9._-]/g, '_');
  return `exposure-letter-${code}-${content.letterDate}.pdf`;
}

const paragraphHtml = (text: string) => `<p>${escapeHtml(text)}</p>`;

/**
 * A worker letter as an e-mail: the whole letter as HTML and as plain text (so it reads without the
 * attachment), with the PDF attached — the same stored content, so the three say the same thing.
 */
export function workerLetterEmail(input: { to: string; content: WorkerLetterContent; pdf: Buffer }): MailMessage {
  const { content } = input;
  const rows = content.results
    .map(
      (result) =>
        `<tr><td style="padding: 4px 8px; border-bottom: 1px solid #cbd2d9">${escapeHtml(result.date)}</td><td style="padding: 4px 8px; border-bottom: 1px solid #cbd2d9">${escapeHtml(result.valueText)}</td><td style="padding: 4px 8px; border-bottom: 1px solid #cbd2d9">${escapeHtml(result.comparison)}</td></tr>`,
    )
    .join('\n');
  const sections = content.sections
    .map((section) => `<h2 style="font-size: 16px; color: #1c6a7d">${escapeHtml(section.heading)}</h2>\n${section.paragraphs.map(paragraphHtml).join('\n')}`)
    .join('\n');
  const html = `<!doctype html>
<html lang="en"><body style="font-family: 'Noto Sans', Arial, sans-serif; color: #1f2933; line-height: 1.5; max-width: 44em">
<h1 style="font-size: 20px">${escapeHtml(content.subject)}</h1>
${paragraphHtml(content.greeting)}
<h2 style="font-size: 16px; color: #1c6a7d">Your result</h2>
${paragraphHtml(content.introduction)}
<table style="border-collapse: collapse; font-size: 14px">
<thead><tr><th style="text-align: left; padding: 4px 8px; background: #e6edf0">Shift date</th><th style="text-align: left; padding: 4px 8px; background: #e6edf0">Your result</th><th style="text-align: left; padding: 4px 8px; background: #e6edf0">Compared with the action level (${escapeHtml(content.actionLevel.text)}) and the limit (${escapeHtml(content.limit.text)})</th></tr></thead>
<tbody>
${rows}
</tbody>
</table>
${sections}
<p>${content.closing.split('\n').map(escapeHtml).join('<br>')}</p>
<div style="border: 1px solid #b7791f; background: #fff6e0; padding: 8px 12px; font-size: 13px">
<strong>Cautions</strong>
<ul>${content.cautions.map((caution) => `<li>${escapeHtml(caution)}</li>`).join('')}</ul>
</div>
<p style="font-size: 13px; color: #52606d">The same letter is attached as a PDF you can print or keep.</p>
</body></html>`;
  return {
    to: input.to,
    subject: content.subject,
    text: `${letterPlainText(content)}\nThe same letter is attached as a PDF you can print or keep.\n`,
    html,
    attachments: [{ filename: workerLetterFileName(content), content: input.pdf, contentType: 'application/pdf' }],
  };
}
