/** @jsxRuntime automatic */
// (The pragma: tsx runs the server with esbuild's defaults, which would compile JSX for a global
// React; the type checker reads the same setting from tsconfig.base.json.)
import { Body, Button, Container, Head, Html, Link, Preview, Section, Text } from '@react-email/components';
import { render } from '@react-email/render';
import { CAUTION_LINE } from '../../shared/caution';

/**
 * What an e-mail of the product says: a heading, the points as a list, one link to the page in
 * the app, then the caution and the unsubscribe link. Every string is text: React escapes it in
 * the HTML part (element content and attribute values alike), so a name a user typed never
 * becomes markup; the plain-text part carries the same words as they are.
 */
export interface MailContent {
  /** First line of the HTML part, bold. */
  heading: string;
  /** Smaller line under the heading (project, time zone). */
  subheading?: string;
  /** The plain-text part's opening lines. */
  textHead: string[];
  /** The points, one list item each. */
  points: string[];
  /** The one link into the app: the button's label, the plain-text label, the address. */
  action: { label: string; textLabel: string; url: string };
  /** The recipient's unsubscribe address (or the mark delivery replaces, server/services/outbox.ts). */
  unsubscribeUrl: string;
}

const INK = '#10222c';
const INK_SOFT = '#4a5d66';
const TEAL = '#0b7a72';

function ProductMail({ content }: { content: MailContent }) {
  return (
    <Html lang="en">
      <Head />
      <Preview>{content.points[0] ?? content.heading}</Preview>
      <Body style={{ fontFamily: 'Manrope,Arial,sans-serif', color: INK, backgroundColor: '#ffffff' }}>
        <Container style={{ maxWidth: '560px', margin: '0' }}>
          <Text style={{ fontSize: '16px', fontWeight: 700, margin: '0 0 4px' }}>{content.heading}</Text>
          {content.subheading ? <Text style={{ fontSize: '13px', color: INK_SOFT, margin: '0 0 12px' }}>{content.subheading}</Text> : null}
          <ul style={{ fontSize: '15px', paddingLeft: '18px' }}>
            {content.points.map((point, i) => (
              <li key={i} style={{ marginBottom: '6px' }}>
                {point}
              </li>
            ))}
          </ul>
          <Section>
            <Button
              href={content.action.url}
              style={{
                display: 'inline-block',
                backgroundColor: TEAL,
                color: '#ffffff',
                padding: '10px 16px',
                borderRadius: '8px',
                textDecoration: 'none',
                fontWeight: 700,
              }}
            >
              {content.action.label}
            </Button>
          </Section>
          <Text style={{ fontSize: '12px', color: INK_SOFT }}>{CAUTION_LINE}</Text>
          <Text style={{ fontSize: '12px' }}>
            <Link href={content.unsubscribeUrl}>Stop these e-mails</Link>
          </Text>
        </Container>
      </Body>
    </Html>
  );
}

/** The plain-text part: the head lines, the points as a dash list, the link, the caution, the unsubscribe link. */
export function mailText(content: MailContent): string {
  return [
    ...content.textHead,
    '',
    ...content.points.map((p) => `- ${p}`),
    '',
    `${content.action.textLabel}: ${content.action.url}`,
    '',
    CAUTION_LINE,
    `Stop these e-mails: ${content.unsubscribeUrl}`,
  ].join('\n');
}

/** Both parts of an e-mail: the HTML rendered by React Email, the plain text beside it. */
export async function renderMail(content: MailContent): Promise<{ text: string; html: string }> {
  return { text: mailText(content), html: await render(<ProductMail content={content} />) };
}
