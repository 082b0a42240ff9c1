import { roleLabels, type Role } from '@schema/permissions';
import type { MailMessage } from './mailer';

/** Escapes text for HTML bodies (names and organization names are user input). */
export function escapeHtml(value: string): string {
  return value.replaceAll('&', '&amp;').replaceAll('<', '&lt;').replaceAll('>', '&gt;').replaceAll('"', '&quot;').replaceAll("'", '&#39;');
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

export function invitationEmail(input: { to: string; organizationName: string; inviterName: string; role: Role; link: string; expiresAt: Date }): MailMessage {
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
  /** The Notification settings page, where this e-mail can be switched off. */
  settingsLink?: string;
}): MailMessage {
  const subject = `Noise log ${input.fileName}: the meter was still for ${input.stillMinutes} min or more`;
  const spans = input.stretches.map(
    (stretch) => `${clockFromSeconds(stretch.startS)}–${clockFromSeconds(stretch.endS)} (${Math.round((stretch.endS - stretch.startS) / 60)} min)`,
  );
  const lines = [
    `Hello ${input.name},`,
    `The noise log ${input.fileName} you uploaded to ${input.organizationName} (worker ${input.workerCode}, shift of ${input.shiftDate}) has ${spans.length === 1 ? 'a still stretch' : `${spans.length} still stretches`} of at least ${input.stillMinutes} minutes, counted from the log start: ${spans.join('; ')}.`,
    'During a still stretch the meter detected no motion: it may have been put down rather than worn. Review the log and mask the span with a reason if it was not worn, before accepting it into the group.',
  ];
  const caution =
    'Statistics support and never replace the judgement of a qualified hygienist. Hearing conservation requirements come from the local regulations that apply.';
  const footer = input.settingsLink ? `${caution} Choose which e-mails you get under Notification settings: ${input.settingsLink}` : caution;
  return {
    to: input.to,
    subject,
    text: `${lines.join('\n\n')}\n\n${input.link}\n\n${footer}\n`,
    html: layout(subject, lines, { label: 'Review the noise log', url: input.link }, footer),
  };
}

// ---------------------------------------------------------------- notifications (docs/decisions/021-notifications.md)

/** PRODUCT.md "Cautions shown in the product", on every message that shows a result. */
export const cautionLine =
  'Statistics support and never replace the judgement of a qualified hygienist. Limits and sampling duties come from the local regulations that apply.';

/** What every notification needs besides its own words: who, where it links, and where to turn it off. */
export interface NotificationEnvelope {
  to: string;
  name: string;
  organizationName: string;
  link: string;
  /** The Notification settings page, so each message says how to stop it. */
  settingsLink: string;
}

function notificationMessage(envelope: NotificationEnvelope, subject: string, lines: string[], linkLabel: string, caution: boolean): MailMessage {
  const footerParts = [
    ...(caution ? [cautionLine] : []),
    `You receive this as a member of ${envelope.organizationName}. Choose which e-mails you get under Notification settings: ${envelope.settingsLink}`,
  ];
  const body = [`Hello ${envelope.name},`, ...lines];
  return {
    to: envelope.to,
    subject,
    text: `${body.join('\n\n')}\n\n${envelope.link}\n\n${footerParts.join('\n\n')}\n`,
    html: layout(subject, body, { label: linkLabel, url: envelope.link }, footerParts.join(' ')),
  };
}

/** A decision record was approved: to its drafter and the organization's managers. */
export function decisionApprovedEmail(
  input: NotificationEnvelope & { groupName: string; recordId: number; approverName: string; categoryText: string; reviewDate: string },
): MailMessage {
  return notificationMessage(
    input,
    `Decision record ${input.recordId} approved: ${input.groupName}`,
    [
      `${input.approverName} approved decision record ${input.recordId} for the exposure group "${input.groupName}" in ${input.organizationName}. Its figures and the results they came from are now frozen.`,
      `${input.categoryText} The next review is due by ${input.reviewDate}.`,
    ],
    'Open the decision record',
    true,
  );
}

/** A draft was returned: to its drafter, with the reviewer's reason. */
export function decisionReturnedEmail(
  input: NotificationEnvelope & { groupName: string; recordId: number; reviewerName: string; reason: string },
): MailMessage {
  return notificationMessage(
    input,
    `Decision record ${input.recordId} returned for changes: ${input.groupName}`,
    [
      `${input.reviewerName} returned your draft decision record ${input.recordId} for the exposure group "${input.groupName}" in ${input.organizationName}.`,
      `The reason given: “${input.reason}”`,
      'Edit the draft and send it back for review when it is ready.',
    ],
    'Open the draft',
    false,
  );
}

/** A newly approved record puts the group in another category than its previous approved record. */
export function categoryChangedEmail(
  input: NotificationEnvelope & {
    groupName: string;
    recordId: number;
    previousRecordId: number;
    previousCategory: number;
    category: number;
    categoryText: string;
  },
): MailMessage {
  const direction = input.category > input.previousCategory ? 'up' : 'down';
  return notificationMessage(
    input,
    `Exposure category ${direction} from ${input.previousCategory} to ${input.category}: ${input.groupName}`,
    [
      `Decision record ${input.recordId}, just approved, puts the exposure group "${input.groupName}" in ${input.organizationName} in category ${input.category}; the previous approved record (${input.previousRecordId}) had category ${input.previousCategory}.`,
      input.categoryText,
      direction === 'up'
        ? 'A higher category usually calls for a look at the controls and the actions in the record.'
        : 'A lower category may allow a longer review interval; the record’s rationale says why.',
    ],
    'Open the decision record',
    true,
  );
}

/** "in 17 days, on 2025-03-20", "tomorrow, …", "today, …" or "on …, 3 days ago". */
function reviewWhen(daysLeft: number, reviewDate: string): string {
  if (daysLeft > 1) return `in ${daysLeft} days, on ${reviewDate}`;
  if (daysLeft === 1) return `tomorrow, ${reviewDate}`;
  if (daysLeft === 0) return `today, ${reviewDate}`;
  return `on ${reviewDate}, ${-daysLeft} days ago`;
}

/** One review falling due, as the reminder e-mails list it. */
export interface ReviewDueItem {
  groupName: string;
  recordId: number;
  reviewDate: string;
  daysLeft: number;
  categoryText: string;
}

/** An approved record's review date is 30 days away or less (or has passed): to managers and hygienists. */
export function reviewDueEmail(input: NotificationEnvelope & ReviewDueItem): MailMessage {
  return notificationMessage(
    input,
    `Review due ${input.daysLeft >= 0 ? `by ${input.reviewDate}` : `since ${input.reviewDate}`}: ${input.groupName}`,
    [
      `The approved decision record ${input.recordId} for the exposure group "${input.groupName}" in ${input.organizationName} is due for review ${reviewWhen(input.daysLeft, input.reviewDate)}.`,
      `${input.categoryText} Plan the sampling for a new assessment and draft a new record when the results are in.`,
    ],
    'Open the decision record',
    true,
  );
}

/** How many records a digest names one by one; the rest are counted and found on the dashboard. */
export const reviewDigestListLimit = 50;

/**
 * Several reviews falling due in one organization on one day: one e-mail listing them (earliest
 * first), so a person is not sent one message per record. Links to the organization's dashboard,
 * whose review lists show every date.
 */
export function reviewDueDigestEmail(input: NotificationEnvelope & { items: readonly ReviewDueItem[] }): MailMessage {
  const overdue = input.items.filter((item) => item.daysLeft < 0).length;
  const shown = input.items.slice(0, reviewDigestListLimit);
  const lines = shown.map((item) => `• ${item.groupName} (decision record ${item.recordId}): review ${reviewWhen(item.daysLeft, item.reviewDate)}.`);
  const more = input.items.length - shown.length;
  return notificationMessage(
    input,
    `Reviews due: ${input.items.length} exposure groups in ${input.organizationName}${overdue > 0 ? ` (${overdue} overdue)` : ''}`,
    [
      `The approved decision records of ${input.items.length} exposure groups in ${input.organizationName} are due for review within 30 days${overdue > 0 ? `, ${overdue} of them already past their date` : ''}:`,
      ...lines,
      ...(more > 0 ? [`…and ${more} more, listed under Review dates on the organization’s dashboard.`] : []),
      'Plan the sampling for a new assessment of each group and draft a new record when the results are in.',
    ],
    'Open the dashboard',
    true,
  );
}
