import { describe, expect, it } from 'vitest';
import { firstName, opensWithGreeting, paragraphsOf, renderReportEmail, type ReportEmailProps } from '@server/modules/reports/report-email';

// Greeting and layout rules are the product's own (common practice, no published source).
const props: ReportEmailProps = {
  shop: { name: 'Kestrel Ridge Motorworks', email: 'desk@kestrel.test', phone: '555-0100', address: null },
  customerName: 'Dana Whitfield',
  reportNumber: 'GR-2026-0007',
  bikeLabel: '2019 Ridgeback Tourer 114',
  message: 'Here is the report for your bike.\n\nThe tune added most above 4,000 rpm.',
  shareUrl: 'http://127.0.0.1:3000/share/abcDEF123_-',
  linkValidUntil: '2027-01-01',
};

describe('report e-mail', () => {
  it('greets the customer by first name in both parts, with the message, link and shop', async () => {
    const { html, text } = await renderReportEmail(props);
    for (const part of [html, text]) {
      expect(part).toContain('Hello Dana,');
      expect(part).toContain('Here is the report for your bike.');
      expect(part).toContain('The tune added most above 4,000 rpm.');
      expect(part).toContain(props.shareUrl);
      expect(part).toContain('Kestrel Ridge Motorworks');
      expect(part).toContain('2027-01-01');
    }
    expect(html).toContain(`href="${props.shareUrl}"`);
    expect(html).toMatch(/^<!DOCTYPE html/i);
    expect(text).not.toMatch(/<[a-z]/i);
    // Each address whole and unbracketed, so a mail client makes it a link.
    expect(text).not.toContain(`[${props.shareUrl}`);
    expect(text).toMatch(new RegExp(`${props.shareUrl.replace(/[/.]/g, '\\$&')}(\\s|$)`));
    // The shop's words keep their paragraphs.
    expect(text.indexOf('Here is the report')).toBeLessThan(text.indexOf('The tune added'));
  });

  it('does not greet twice when the shop’s message opens with its own greeting', async () => {
    const { text } = await renderReportEmail({ ...props, message: 'Hi Dana, here it is.' });
    expect(text.match(/Hello|Hi /g)).toEqual(['Hi ']);
  });

  it('reads first names, greetings and paragraphs', () => {
    expect(firstName('Dana Whitfield')).toBe('Dana');
    expect(firstName('  Cher ')).toBe('Cher');
    expect(opensWithGreeting('Hello Dana,')).toBe(true);
    expect(opensWithGreeting('dear rider')).toBe(true);
    expect(opensWithGreeting('Highlights of your tune')).toBe(false);
    expect(paragraphsOf('a\r\n\r\nb\n \nc\n')).toEqual(['a', 'b', 'c']);
    expect(paragraphsOf('one\ntwo')).toEqual(['one\ntwo']);
  });
});
