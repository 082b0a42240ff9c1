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
