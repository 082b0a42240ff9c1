/**
 * The review-reminder digest (backend/src/email/templates.ts): one e-mail listing every review newly
 * due for a person in one organization, earliest first as given, with overdue ones counted, the list
 * cut at `reviewDigestListLimit` with the rest counted, and the caution every result-bearing e-mail carries
 * (PRODUCT.md "Cautions shown in the product").
 */
import { describe, expect, it } from 'vitest';
import { cautionLine, reviewDigestListLimit, reviewDueDigestEmail, type ReviewDueItem } from '../../../backend/src/email/templates';

const envelope = {
  to: 'manager@ridgeback.example',
  name: 'Morgan Manager',
  organizationName: 'Ridgeback Timber Co.',
  link: 'http://bellwether.test/orgs/1',
  settingsLink: 'http://bellwether.test/account/notifications',
};

function item(index: number, daysLeft: number): ReviewDueItem {
  return {
    groupName: `Group ${index} – <noise>`,
    recordId: 100 + index,
    reviewDate: `2025-04-${String(1 + (index % 28)).padStart(2, '0')}`,
    daysLeft,
    categoryText: '',
  };
}

describe('review-reminder digest e-mail', () => {
  it('names each record with its review date, counts the overdue ones and links to the dashboard', () => {
    const message = reviewDueDigestEmail({ ...envelope, items: [item(1, -3), item(2, 0), item(3, 1), item(4, 12)] });
    expect(message.subject).toBe('Reviews due: 4 exposure groups in Ridgeback Timber Co. (1 overdue)');
    expect(message.text).toContain('• Group 1 – <noise> (decision record 101): review on 2025-04-02, 3 days ago.');
    expect(message.text).toContain('• Group 2 – <noise> (decision record 102): review today, 2025-04-03.');
    expect(message.text).toContain('• Group 3 – <noise> (decision record 103): review tomorrow, 2025-04-04.');
    expect(message.text).toContain('• Group 4 – <noise> (decision record 104): review in 12 days, on 2025-04-05.');
    expect(message.text).toContain(cautionLine);
    expect(message.text).toContain(envelope.link);
    // Group names are user input: escaped in the HTML part.
    expect(message.html).toContain('Group 1 – &lt;noise&gt;');
    expect(message.html).not.toContain('<noise>');
  });

  it(`lists at most ${reviewDigestListLimit} records and counts the rest`, () => {
    const items = Array.from({ length: reviewDigestListLimit + 7 }, (_, index) => item(index, 5));
    const message = reviewDueDigestEmail({ ...envelope, items });
    expect(message.subject).toBe(`Reviews due: ${reviewDigestListLimit + 7} exposure groups in Ridgeback Timber Co.`);
    expect(message.text.match(/^• /gm)).toHaveLength(reviewDigestListLimit);
    expect(message.text).toContain('…and 7 more, listed under Review dates on the organization’s dashboard.');
    expect(message.text).not.toContain(`decision record ${100 + reviewDigestListLimit})`);
  });
});
