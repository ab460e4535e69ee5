/**
 * The template system: Handlebars (kept, widely used, escapes HTML by default, logic-less enough
 * that wording stays in the templates). Every message has an HTML and a text template in
 * ./templates; both are wrapped in the shared layout with the reason, the unsubscribe link and the
 * preferences link. Templates compile in strict mode, so a missing field fails loudly in tests.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import Handlebars from 'handlebars';
import { styles } from './styles';

const templateDir = fileURLToPath(new URL('./templates/', import.meta.url));

export const templateNames = [
  'invitation',
  'password-reset',
  'account-confirm',
  'account-exists',
  'swap-announcement',
  'signup-confirmation',
  'signup-reminder',
  'due-reminder',
  'receipt',
  'distribution',
  'coordinator-digest',
  'payment-receipt',
] as const;
export type TemplateName = (typeof templateNames)[number];

export interface RenderedMail {
  subject: string;
  text: string;
  html: string;
}

/** What the layout around every message needs. */
export interface MailFrame {
  subject: string;
  /** The line inboxes show after the subject. */
  preheader: string;
  heading: string;
  /** Why this person gets this message, in one sentence. */
  reason: string;
  /** One-click unsubscribe from this kind of message; null for account mail. */
  unsubscribe: { url: string; label: string } | null;
  preferencesUrl: string | null;
}

function engine(flavour: 'html' | 'text') {
  const hb = Handlebars.create();
  hb.registerHelper('s', (name: keyof typeof styles) => {
    if (!(name in styles)) throw new Error(`Unknown mail style "${String(name)}"`);
    return styles[name];
  });
  hb.registerHelper('eq', (a: unknown, b: unknown) => a === b);
  hb.registerHelper('gt', (a: number, b: number) => a > b);
  hb.registerHelper(
    'plural',
    (count: number, singular: string, pluralForm: unknown) =>
      `${count} ${count === 1 ? singular : typeof pluralForm === 'string' ? pluralForm : `${singular}s`}`,
  );
  if (flavour === 'html') {
    // A bulletproof button: a table cell with the link inside, so Outlook keeps the colour.
    hb.registerHelper('button', (url: string, label: string) => {
      const u = hb.escapeExpression(url);
      const l = hb.escapeExpression(label);
      return new hb.SafeString(
        `<table role="presentation" cellpadding="0" cellspacing="0" style="margin:8px 0 20px"><tr><td style="${styles.buttonCell}">` +
          `<a href="${u}" style="${styles.button}">${l}</a></td></tr></table>`,
      );
    });
    // Text people typed (a swap's description, a cut list): escaped, line breaks kept.
    hb.registerHelper('multiline', (text: string) => new hb.SafeString(hb.escapeExpression(text).replace(/\r?\n/g, '<br>')));
  } else {
    hb.registerHelper('multiline', (text: string) => text);
    // Plain-text underline for headings, as long as the heading.
    hb.registerHelper('underline', (text: string) => '-'.repeat(Math.min(String(text).length, 60)));
  }
  return hb;
}

const engines = { html: engine('html'), text: engine('text') };
const cache = new Map<string, Handlebars.TemplateDelegate>();

function template(name: string, flavour: 'html' | 'text'): Handlebars.TemplateDelegate {
  const key = `${name}.${flavour}`;
  let compiled = cache.get(key);
  if (!compiled) {
    const source = readFileSync(`${templateDir}${name}.${flavour}.hbs`, 'utf8');
    compiled = engines[flavour].compile(source, { strict: true, noEscape: flavour === 'text' });
    cache.set(key, compiled);
  }
  return compiled;
}

/** Collapses the blank lines Handlebars blocks leave in plain text, keeping paragraph breaks. */
function tidyText(text: string) {
  // Trailing spaces and tabs go line by line: a pattern hunting them across the whole text can take
  // quadratic time on a long run of spaces that ends in something else.
  const lines = text.split('\n').map((line) => {
    let end = line.length;
    while (end > 0 && (line[end - 1] === ' ' || line[end - 1] === '\t')) end -= 1;
    return line.slice(0, end);
  });
  return `${lines
    .join('\n')
    .replace(/\n{3,}/g, '\n\n')
    .trim()}\n`;
}

/** Renders one message's HTML and text versions inside the shared layout. */
export function renderMail(name: TemplateName, view: object, frame: MailFrame): RenderedMail {
  const html = template('layout', 'html')({ ...frame, body: new Handlebars.SafeString(template(name, 'html')(view)) });
  const text = template('layout', 'text')({ ...frame, body: template(name, 'text')(view) });
  return { subject: frame.subject, html, text: tidyText(text) };
}
