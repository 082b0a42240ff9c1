import { roleLabels, type Role } from '@schema/permissions';
import type { MailMessage } from './mailer';

/** Escapes text for HTML bodies (names and organization names are user input). */
export function escapeHtml(value: string): string {
  return value
    .replaceAll('&', '&amp;')
    .replaceAll('<', '&lt;')
    .replaceAll('>', '&gt;')
    .replaceAll('"', '&quot;')
    .replaceAll("'", '&#39;');
}

/** One plain layout for every message: a heading, paragraphs, one button-like link. */
function layout(heading: string, paragraphs: string[], link: { label: string; url: string }, footer: string): string {
  const body = paragraphs.map((paragraph) => `<p>${escapeHtml(paragraph)}</p>`).join('\n');
  return `<!doctype html>
<html lang="en"><body style="font-family: 'Noto Sans', Arial, sans-serif; color: #1f2933; line-height: 1.5">
<h1 style="font-size: 20px">${escapeHtml(heading)}</h1>
${body}
<p><a href="${escapeHtml(link.url)}" style="display: inline-block; padding: 8px 16px; background: #23476b; color: #ffffff; text-decoration: none; border-radius: 4px">${escapeHtml(link.label)}</a></p>
<p style="font-size: 13px; color: #52606d">If the button does not work, copy this address into your browser:<br>${escapeHtml(link.url)}</p>
<p style="font-size: 13px; color: #52606d">${escapeHtml(footer)}</p>
</body></html>`;
}

function formatWhen(moment: Date): string {
  return `${moment.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

export function invitationEmail(input: {
  to: string;
  organizationName: string;
  inviterName: string;
  role: Role;
  link: string;
  expiresAt: Date;
}): MailMessage {
  const role = roleLabels[input.role];
  const subject = `You are invited to ${input.organizationName} on Bellwether`;
  const lines = [
    `${input.inviterName} invited you to join ${input.organizationName} on Bellwether as ${role}.`,
    `Open the link to choose your password and sign in. The link works once and expires on ${formatWhen(input.expiresAt)}.`,
  ];
  const footer = 'If you did not expect this invitation, ignore this e-mail; nothing happens unless the link is opened.';
  return {
    to: input.to,
    subject,
    text: `${lines.join('\n\n')}\n\n${input.link}\n\n${footer}\n`,
    html: layout(subject, lines, { label: 'Accept the invitation', url: input.link }, footer),
  };
}

export function passwordResetEmail(input: { to: string; name: string; link: string; expiresAt: Date }): MailMessage {
  const subject = 'Reset your Bellwether password';
  const lines = [
    `Hello ${input.name},`,
    `Someone (we hope you) asked to reset your Bellwether password. Open the link to choose a new one. It works once and expires on ${formatWhen(input.expiresAt)}.`,
  ];
  const footer = 'If you did not ask for this, ignore this e-mail; your password stays as it is.';
  return {
    to: input.to,
    subject,
    text: `${lines.join('\n\n')}\n\n${input.link}\n\n${footer}\n`,
    html: layout(subject, lines, { label: 'Choose a new password', url: input.link }, footer),
  };
}

/** Minutes and seconds from log start, e.g. 312 min 05 s → "5:12:05". */
function clockFromSeconds(seconds: number): string {
  const whole = Math.round(seconds);
  const hours = Math.floor(whole / 3600);
  const minutes = Math.floor((whole % 3600) / 60);
  const rest = whole % 60;
  return `${hours}:${String(minutes).padStart(2, '0')}:${String(rest).padStart(2, '0')}`;
}

/**
 * To the hygienist who uploaded a noise log whose wear check found a still stretch at least the
 * organization's still-time setting long: the meter may have been put down rather than worn.
 */
export function stillStretchEmail(input: {
  to: string;
  name: string;
  organizationName: string;
  fileName: string;
  workerCode: string;
  shiftDate: string;
  stretches: ReadonlyArray<{ startS: number; endS: number }>;
  stillMinutes: number;
  link: string;
}): MailMessage {
  const subject = `Noise log ${input.fileName}: the meter was still for ${input.stillMinutes} min or more`;
  const spans = input.stretches.map((stretch) => `${clockFromSeconds(stretch.startS)}–${clockFromSeconds(stretch.endS)} (${Math.round((stretch.endS - stretch.startS) / 60)} min)`);
  const lines = [
    `Hello ${input.name},`,
    `The noise log ${input.fileName} you uploaded to ${input.organizationName} (worker ${input.workerCode}, shift of ${input.shiftDate}) has ${spans.length === 1 ? 'a still stretch' : `${spans.length} still stretches`} of at least ${input.stillMinutes} minutes, counted from the log start: ${spans.join('; ')}.`,
    'During a still stretch the meter detected no motion: it may have been put down rather than worn. Review the log and mask the span with a reason if it was not worn, before accepting it into the group.',
  ];
  const footer = 'Statistics support and never replace the judgement of a qualified hygienist. Hearing conservation requirements come from the local regulations that apply.';
  return {
    to: input.to,
    subject,
    text: `${lines.join('\n\n')}\n\n${input.link}\n\n${footer}\n`,
    html: layout(subject, lines, { label: 'Review the noise log', url: input.link }, footer),
  };
}
