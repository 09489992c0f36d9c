// The frame every report page shares: head with a Content-Security-Policy that admits only the page's own
// inline style sheet and script by their SHA-256 hashes (CSP Level 2 hash sources), header, main, the
// footer with the safety caution, and the page's data as JSON that cannot close its element.

import { createHash } from 'node:crypto';
import { SAFETY_CAUTION } from '../lap-summary.js';
import { escapeHtml, jsonForScript } from './escape.js';
import { PAGE_STYLE } from './style.js';

export interface PageParts {
  /** Plain text; escaped here. */
  title: string;
  subtitle: string;
  /** Markup under the title (already escaped). */
  header?: string;
  /** The page's body between header and footer (already escaped). */
  main: string;
  /** Markup of the footer's second paragraph (already escaped). */
  footerNote: string;
  /** The caution of the footer, plain text (the lap's caution when omitted). */
  caution?: string;
  /** Data for the script, written into <script type="application/json" id="...">. */
  data?: { id: string; value: unknown };
  /** The page's own script; a page without one gets script-src 'none'. */
  script?: string;
}

function sha256Base64(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('base64');
}

/** Everything 'none' except the inline style sheet and script named by their hashes. */
export function contentSecurityPolicy(style: string, script: string | undefined): string {
  return [
    "default-src 'none'",
    script === undefined ? "script-src 'none'" : `script-src 'sha256-${sha256Base64(script)}'`,
    `style-src 'sha256-${sha256Base64(style)}'`,
    "img-src 'none'",
    "connect-src 'none'",
    "font-src 'none'",
    "object-src 'none'",
    "base-uri 'none'",
    "form-action 'none'",
  ].join('; ');
}

/** One self-contained page; pure (no I/O). */
export function htmlPage(parts: PageParts): string {
  const style = PAGE_STYLE;
  const csp = contentSecurityPolicy(style, parts.script);
  const data = parts.data
    ? `<script type="application/json" id="${escapeHtml(parts.data.id)}">${jsonForScript(parts.data.value)}</script>\n`
    : '';
  const script = parts.script === undefined ? '' : `<script>${parts.script}</script>\n`;
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${csp}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="referrer" content="no-referrer">
<title>${escapeHtml(parts.title)}</title>
<style>${style}</style>
</head>
<body>
<header>
<h1>${escapeHtml(parts.title)}</h1>
<p class="subtitle">${escapeHtml(parts.subtitle)}</p>
${parts.header ?? ''}
</header>
<main>
${parts.main}
</main>
<footer>
<p class="caution">${escapeHtml(parts.caution ?? SAFETY_CAUTION)}</p>
<p>${parts.footerNote}</p>
</footer>
${data}${script}</body>
</html>
`;
}
