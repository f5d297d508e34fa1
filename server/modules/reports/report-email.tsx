/**
 * The report e-mail: an HTML message with a plain-text part, both rendered from one React
 * template (@react-email/components, @react-email/render). It greets the customer by first name,
 * carries the shop's own message, the link to the report online and the PDF's caution, and signs
 * off with the shop's name and contact details. The sender's display name is the shop's
 * (`fromName`, set at the call site).
 */
import { Body, Button, Container, Head, Hr, Html, Link, Preview, Section, Text } from '@react-email/components';
import { render } from '@react-email/render';
import { Fragment } from 'react';
import { palette } from '@shared/theme';

export interface ReportEmailProps {
  shop: { name: string; email: string | null; phone: string | null; address: string | null };
  customerName: string;
  reportNumber: string;
  bikeLabel: string;
  /** The shop's own words, as typed in the send dialog (may start with its own greeting). */
  message: string;
  shareUrl: string;
  /** Last day the link works (YYYY-MM-DD). */
  linkValidUntil: string;
}

/** The customer's first name, or the whole name when it has no spaces. */
export const firstName = (name: string) => name.trim().split(/\s+/)[0] || name.trim();

/** Whether the shop's message already opens with a greeting, so the template does not add a second one. */
export function opensWithGreeting(message: string): boolean {
  return /^\s*(hello|hi|hey|dear|good (morning|afternoon|evening))\b/i.test(message);
}

/** The message split into paragraphs at blank lines, each trimmed; empty ones dropped. */
export function paragraphsOf(message: string): string[] {
  return message
    .replace(/\r\n?/g, '\n')
    .split(/\n\s*\n/)
    .map((p) => p.trim())
    .filter(Boolean);
}

export const CAUTION =
  'Dyno figures depend on the dyno, the correction standard and the conditions; compare like with like. The PDF explains the figures and the cautions that go with them.';

const text = { color: palette.ink.DEFAULT, fontSize: '15px', lineHeight: '22px', margin: '0 0 14px' } as const;
const muted = { ...text, color: palette.ink.muted, fontSize: '13px', lineHeight: '19px' } as const;

export function ReportEmail(p: ReportEmailProps) {
  const paragraphs = paragraphsOf(p.message);
  return (
    <Html lang="en">
      <Head />
      <Preview>{`Gain report ${p.reportNumber} for your ${p.bikeLabel}`}</Preview>
      <Body style={{ backgroundColor: palette.paper.DEFAULT, fontFamily: 'Helvetica, Arial, sans-serif', margin: 0, padding: '24px 0' }}>
        <Container style={{ backgroundColor: palette.paper.raised, border: `1px solid ${palette.line.DEFAULT}`, borderRadius: '8px', maxWidth: '560px', padding: '28px' }}>
          <Text style={{ ...text, fontSize: '18px', fontWeight: 700 }}>{p.shop.name}</Text>
          {!opensWithGreeting(p.message) && <Text style={text}>{`Hello ${firstName(p.customerName)},`}</Text>}
          {paragraphs.map((para, i) => (
            <Text key={i} style={text}>
              {para.split('\n').map((line, j) => (
                <Fragment key={j}>
                  {j > 0 && <br />}
                  {line}
                </Fragment>
              ))}
            </Text>
          ))}
          <Section style={{ margin: '8px 0 18px' }}>
            <Button href={p.shareUrl} style={{ backgroundColor: palette.accent.DEFAULT, borderRadius: '6px', color: '#FFFFFF', fontSize: '15px', fontWeight: 700, padding: '12px 20px' }}>
              View the report online
            </Button>
          </Section>
          <Text style={muted}>
            {`The link works until ${p.linkValidUntil}: `}
            <Link href={p.shareUrl} style={{ color: palette.accent.DEFAULT }}>
              {p.shareUrl}
            </Link>
          </Text>
          <Text style={muted}>{`The PDF of gain report ${p.reportNumber} is attached.`}</Text>
          <Hr style={{ borderColor: palette.line.DEFAULT, margin: '20px 0' }} />
          <Text style={muted}>{CAUTION}</Text>
          <Text style={{ ...muted, color: palette.ink.DEFAULT }}>{p.shop.name}</Text>
          {[p.shop.address, p.shop.phone, p.shop.email].filter(Boolean).map((line) => (
            <Text key={line} style={{ ...muted, margin: '0 0 4px' }}>
              {line}
            </Text>
          ))}
        </Container>
      </Body>
    </Html>
  );
}

/**
 * Plain text: no wrapping (links stay whole), a link's address after its words without brackets,
 * and written once when the words are the address.
 */
const PLAIN_TEXT = { wordwrap: false as const, selectors: [{ selector: 'a', options: { linkBrackets: false as const, hideLinkHrefIfSameAsText: true } }] };

/** The HTML and the plain-text part of the report e-mail. */
export async function renderReportEmail(props: ReportEmailProps): Promise<{ html: string; text: string }> {
  const element = <ReportEmail {...props} />;
  const [html, plain] = await Promise.all([render(element), render(element, { plainText: true, htmlToTextOptions: PLAIN_TEXT })]);
  return { html, text: plain.trim() };
}
