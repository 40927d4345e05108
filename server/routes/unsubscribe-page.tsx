/** @jsxRuntime automatic */
// (The pragma: tsx compiles JSX with esbuild's defaults otherwise; see server/mail/message.tsx.)
import { renderToStaticMarkup } from 'react-dom/server';

/**
 * The unsubscribe page: a title, a sentence and, on the confirmation page, the one-click button.
 * React escapes every value (the form's address holds the link's query parameters), so nothing a
 * caller sends becomes markup.
 */
export function unsubscribePage(title: string, body: string, formAction?: string): string {
  return `<!doctype html>${renderToStaticMarkup(
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta name="viewport" content="width=device-width,initial-scale=1" />
        <title>{title}</title>
      </head>
      <body style={{ fontFamily: 'system-ui,sans-serif', maxWidth: '520px', margin: '48px auto', padding: '0 16px', color: '#10222c' }}>
        <h1 style={{ fontSize: '22px' }}>{title}</h1>
        <p>{body}</p>
        {formAction ? (
          <form method="post" action={formAction}>
            <input type="hidden" name="List-Unsubscribe" value="One-Click" />
            <button type="submit" style={{ fontSize: '16px', padding: '10px 16px', minHeight: '44px' }}>
              Stop these e-mails
            </button>
          </form>
        ) : null}
      </body>
    </html>,
  )}`;
}
