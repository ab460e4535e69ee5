/**
 * The mail templates and what feeds them, without a database: every template renders an HTML and a
 * text version inside the layout, typed-in text is escaped, the cutting plans agree with published
 * unit formulas, dates land in the guild's zone, and unsubscribe tokens cannot be altered.
 */
import { describe, expect, it } from 'vitest';
import { renderMail, templateNames, type MailFrame, type TemplateName } from '../../server/mail/render';
import { pledgePlan } from '../../server/mail/cutting-plan';
import { isoWeek, localDateKey, mailDate, mailYards } from '../../server/mail/format';
import { unsubscribeHeaders, unsubscribeToken, verifyUnsubscribeToken } from '../../server/mail/unsubscribe-token';
import { invitationMail, passwordResetMail } from '../../server/mail/account-messages';
import { planView } from '../../server/mail/compose/signup-confirmation';

const frame: MailFrame = {
  subject: 'Subject line',
  preheader: 'Preheader line',
  heading: 'Heading & line',
  reason: 'You get this because you are testing.',
  unsubscribe: { url: 'http://127.0.0.1:3000/unsubscribe?token=1.reminders.abc', label: 'deadline reminders' },
  preferencesUrl: 'http://127.0.0.1:3000/settings/email',
};

const swapView = {
  title: 'Scrap Stars',
  description: 'Line one\nLine two',
  kindLabel: 'Grid block',
  finished: '9″ × 9″',
  unfinished: '9½″ × 9½″',
  seam: '¼″',
  tolerance: '⅛″ either way',
  squareness: '¼″',
  colourRules: [{ role: 'light', note: 'cream' }],
  quota: '1 to 6 blocks each, your choice',
  signupCloses: 'Wednesday 10 March 2027 at 12:00 pm',
  signupClosesIn: 'in 5 days',
  due: 'Tuesday 20 April 2027 at 12:00 pm',
  dueIn: 'in 45 days',
  zone: 'America/Chicago time',
  mode: 'Makers get back as many blocks as they hand in.',
};

const fixtures: Record<Exclude<TemplateName, 'invitation' | 'password-reset'>, object> = {
  'account-confirm': { url: 'http://127.0.0.1:3000/confirm-email?token=abc&next=%2Fguilds', validHours: 24 },
  'account-exists': {
    displayName: 'Nell',
    signInUrl: 'http://127.0.0.1:3000/sign-in',
    forgotUrl: 'http://127.0.0.1:3000/forgot-password',
  },
  'payment-receipt': {
    name: 'Nell',
    guildName: 'Kestrel Hollow Quilters',
    refunded: false,
    lines: [{ label: 'Swap entry fee: Scrap Stars', amount: '$5.00' }],
    total: '$5.00',
    reference: 'BP-12',
    when: 'Tuesday 20 April 2027 at 12:00 pm',
    url: 'http://x/settings/payments',
  },
  'swap-announcement': {
    name: 'Nell',
    guildName: 'Kestrel Hollow Quilters',
    swap: swapView,
    url: 'http://127.0.0.1:3000/guilds/1/swaps/2',
  },
  'signup-confirmation': {
    name: 'Nell',
    swapTitle: 'Scrap Stars',
    blocks: 2,
    blocksText: '2 blocks',
    unfinished: '9½″ × 9½″',
    due: 'Tuesday 20 April 2027',
    dueIn: 'in 45 days',
    zone: 'UTC',
    signupCloses: 'Wednesday 10 March 2027',
    wof: '42″',
    url: 'http://x/s',
    plan: planView(pledgePlan({ kind: 'hst', finished: 3, method: 'two-at-a-time' }, 2), 'in'),
  },
  'signup-reminder': {
    name: 'Nell',
    swapTitle: 'Scrap Stars',
    owedText: '2 blocks',
    pledgedText: '2 blocks',
    handedIn: 0,
    handedInText: '0 blocks',
    closes: 'Wednesday',
    closesIn: 'in 5 days',
    due: 'Tuesday',
    dueIn: 'in 45 days',
    unfinished: '9½″ × 9½″',
    tolerance: '⅛″ either way',
    zone: 'UTC',
    url: 'http://x/s',
  },
  'due-reminder': {
    name: 'Nell',
    swapTitle: 'Scrap Stars',
    owedText: '1 block',
    pledgedText: '2 blocks',
    handedIn: 1,
    handedInText: '1 block',
    closes: 'Wednesday',
    closesIn: 'in 5 days',
    due: 'Tuesday',
    dueIn: 'tomorrow',
    unfinished: '9½″ × 9½″',
    tolerance: '⅛″ either way',
    zone: 'UTC',
    url: 'http://x/s',
  },
  receipt: {
    name: 'Nell',
    swapTitle: 'Scrap Stars',
    receivedText: '2 blocks',
    measuredCount: 2,
    measuredText: 'all 2',
    unfinished: '9½″ × 9½″',
    owed: 0,
    owedText: '0 blocks',
    due: 'Tuesday',
    needsCare: true,
    url: 'http://x/s',
    blocks: [
      { label: 'Block 1', verdict: 'True to size', glyph: '✓', verdictStyle: 'verdict_true', measured: null, advice: null },
      {
        label: 'Block 2',
        verdict: 'Out of square',
        glyph: '◇',
        verdictStyle: 'verdict_skewed',
        measured: '9½″ × 9½″',
        advice: 'Press & square it.',
      },
    ],
  },
  distribution: {
    name: 'Nell',
    swapTitle: 'Scrap Stars',
    countText: '3 blocks',
    makersText: '2 makers',
    makers: [
      { name: 'Ada', count: 2 },
      { name: 'Bo', count: 1 },
    ],
    gift: false,
    url: 'http://x/s',
  },
  'coordinator-digest': {
    name: 'Ada',
    guildName: 'Kestrel Hollow Quilters',
    from: 'Monday 1 March 2027',
    to: 'Monday 8 March 2027',
    swaps: [
      {
        title: 'Scrap Stars',
        stateLabel: 'Sewing',
        nextDeadline: null,
        changes: ['2 blocks handed in.'],
        totals: { pledged: 4, makers: '2 makers', handedIn: 2, measured: 0, owed: 2, owing: '1 member' },
        url: 'http://x/s',
      },
    ],
  },
};

describe('templates', () => {
  it.each(Object.entries(fixtures))('%s renders an HTML and a text version inside the layout', (name, view) => {
    const mail = renderMail(name as TemplateName, view, frame);
    expect(mail.subject).toBe('Subject line');
    expect(mail.html).toMatch(/^<!doctype html>\n<html lang="en">/);
    expect(mail.html).toContain('Preheader line');
    expect(mail.html).toContain('Heading &amp; line');
    expect(mail.html).toContain('href="http://127.0.0.1:3000/unsubscribe?token&#x3D;1.reminders.abc"');
    expect(mail.html).toMatch(/font-size:18px/);
    expect(mail.html).not.toMatch(/\{\{|\}\}|undefined|\[object Object\]/);
    expect(mail.text).toContain('Stop e-mails about deadline reminders');
    expect(mail.text).toContain('http://127.0.0.1:3000/unsubscribe?token=1.reminders.abc');
    expect(mail.text).not.toMatch(/<[a-z][^>]*>|\{\{|undefined|\[object Object\]|&amp;|&#/);
    expect(mail.text).not.toMatch(/\n{3,}/);
  });

  it('covers every template name', () => {
    expect([...Object.keys(fixtures), 'invitation', 'password-reset'].sort()).toEqual([...templateNames].sort());
  });

  it('escapes typed-in text in HTML and keeps it as typed in text', () => {
    const view = { ...fixtures['swap-announcement'], swap: { ...swapView, title: 'Scrap <b>Stars</b> & Co' } };
    const mail = renderMail('swap-announcement', view, frame);
    expect(mail.html).toContain('Scrap &lt;b&gt;Stars&lt;/b&gt; &amp; Co');
    expect(mail.html).toContain('Line one<br>Line two');
    expect(mail.text).toContain('Scrap <b>Stars</b> & Co');
  });

  it('leaves the unsubscribe link out of account mail, which is always sent', () => {
    const invite = invitationMail({
      to: 'a@example.test',
      guildName: 'Kestrel Hollow Quilters',
      inviterName: 'Ada',
      role: 'member',
      url: 'http://x/i/t',
      expiresAt: new Date('2027-01-05T12:00:00Z'),
    });
    const reset = passwordResetMail({
      to: 'a@example.test',
      displayName: 'Nell',
      url: 'http://x/reset-password?token=t',
      validMinutes: 60,
    });
    for (const mail of [invite, reset]) {
      expect(mail.text).not.toMatch(/unsubscribe|Stop e-mails/i);
      expect(mail.html).not.toMatch(/unsubscribe/i);
    }
    expect(invite.text).toContain('Accept the invitation: http://x/i/t');
    expect(invite.text).toContain('good until Tuesday 5 January 2027 at 12:00 pm UTC');
    expect(reset.subject).toBe('Reset your Blockpost password');
  });
});

describe('cutting plans from the unit formulas', () => {
  // Cut sizes as in quilt guild block-making handouts (common practice, no source): HST two at a
  // time finished + ⅞″; QST finished + 1¼″; flying geese no-waste width + 1¼″ and height + ⅞″;
  // square-in-a-square centre S⁄√2 + ½″ (rounded up to ⅛″), corners S⁄2 + ⅞″.
  it('HSTs: two squares of finished + ⅞″ make two units', () => {
    const plan = pledgePlan({ kind: 'hst', finished: 3, method: 'two-at-a-time' }, 5);
    expect(plan.cuts).toEqual([
      { fabric: 'Light', width: 3.875, height: 3.875, count: 3, note: null },
      { fabric: 'Dark', width: 3.875, height: 3.875, count: 3, note: null },
    ]);
    expect(plan.note).toBe('This makes 1 spare HST.');
    // The swap's own colour roles name the fabrics, as the screens do.
    const named = pledgePlan({ kind: 'hst', finished: 3, method: 'trim' }, 2, undefined, ['cream', 'indigo']);
    expect(named.cuts.map((c) => c.fabric)).toEqual(['cream', 'indigo']);
    // The trim size in fractions with the inch mark: 3″ finished + ½″ = 3½″ (common practice, no source).
    expect(named.note).toContain('Trim each HST to 3½″ square.');
  });

  it('QSTs: finished + 1¼″', () => {
    const plan = pledgePlan({ kind: 'qst', finished: 4 }, 4);
    expect(plan.cuts.map((c) => [c.width, c.count])).toEqual([
      [5.25, 2],
      [5.25, 2],
    ]);
  });

  it('flying geese, no-waste: one big square and four small ones make four', () => {
    const plan = pledgePlan({ kind: 'flying-geese', finished: { width: 4, height: 2 }, method: 'no-waste' }, 8);
    expect(plan.cuts).toEqual([
      { fabric: 'Goose fabric', width: 5.25, height: 5.25, count: 2, note: null },
      { fabric: 'Sky fabric', width: 2.875, height: 2.875, count: 8, note: null },
    ]);
  });

  it('square-in-a-square: 4″ finished gives a 3⅜″ centre (2.828 + ½ rounded up) and 2⅞″ corners', () => {
    const plan = pledgePlan({ kind: 'square-in-square', finished: 4 }, 3);
    expect(plan.cuts.map((c) => [c.fabric, c.width, c.count])).toEqual([
      ['Centre fabric', 3.375, 3],
      ['Corner fabric', 2.875, 6],
    ]);
  });

  it('yardage: strips across a 42″ width, each fabric rounded up to ⅛ yd', () => {
    // Two 2½″ patches per block, 14 blocks: 14 squares of each fabric. ⌊42 ⁄ 2½⌋ = 16 per strip, so
    // one strip = 2½″ = 0.069 yd → ⅛ yd; one fabric for all 28 squares: 2 strips = 5″ = 0.139 yd → ¼ yd
    // (squares per strip ⌊WOF ⁄ s⌋ as in the team's fabric references; ⅛ yd steps: common practice, no source).
    const plan = pledgePlan({ kind: 'grid', columns: [2.5, 2.5], rows: [2.5], roles: [['light', 'dark']] }, 14);
    expect(plan.fabrics).toEqual([
      { fabric: 'dark', strips: [{ width: 2.5, count: 1 }], yards: 0.125 },
      { fabric: 'light', strips: [{ width: 2.5, count: 1 }], yards: 0.125 },
    ]);
    expect(pledgePlan({ kind: 'grid', columns: [2.5, 2.5], rows: [2.5] }, 14).fabrics).toEqual([
      { fabric: 'Any fabric', strips: [{ width: 2.5, count: 2 }], yards: 0.25 },
    ]);
  });

  it('a custom block passes its cut list through and works out no yardage', () => {
    const plan = pledgePlan({ kind: 'custom', finished: { width: 6, height: 6 }, cutList: 'One 6½″ square' }, 2);
    expect(plan).toMatchObject({ customCutList: 'One 6½″ square', cuts: [], fabrics: [] });
  });
});

describe('formats', () => {
  it('writes dates in the guild zone, across a daylight-saving change', () => {
    // IANA tz database (checked with GNU date): Chicago is UTC−6 until 14 March 2027, then UTC−5.
    expect(mailDate('2027-03-10T18:00:00Z', 'America/Chicago')).toBe('Wednesday 10 March 2027 at 12:00 pm');
    expect(mailDate('2027-03-20T17:00:00Z', 'America/Chicago')).toBe('Saturday 20 March 2027 at 12:00 pm');
    expect(localDateKey('2027-03-11T03:00:00Z', 'America/Chicago')).toBe('2027-03-10');
  });

  it('gives metres beside yards for metric readers (1 yd = 0.9144 m exactly, NIST SP 811)', () => {
    expect(mailYards(0.375, 'in')).toBe('⅜ yd');
    expect(mailYards(1.125, 'mm')).toBe('1⅛ yd (1.03 m)');
  });

  it('names ISO 8601 weeks (checked with GNU date +%G-W%V)', () => {
    expect(isoWeek(new Date('2027-01-01T12:00:00Z'))).toBe('2026-W53');
    expect(isoWeek(new Date('2027-01-04T12:00:00Z'))).toBe('2027-W01');
  });
});

describe('unsubscribe tokens', () => {
  const secret = 'test-secret-test-secret';
  it('round-trips and refuses any altered part or another secret', () => {
    const token = unsubscribeToken(secret, 7, 'reminders');
    expect(verifyUnsubscribeToken(secret, token)).toEqual({ userId: 7, category: 'reminders' });
    expect(verifyUnsubscribeToken(secret, token.replace(/^7\./, '8.'))).toBeNull();
    expect(verifyUnsubscribeToken(secret, token.replace('.reminders.', '.receipts.'))).toBeNull();
    expect(verifyUnsubscribeToken('another-secret-entirely', token)).toBeNull();
    expect(verifyUnsubscribeToken(secret, `${token.slice(0, -1)}${token.endsWith('A') ? 'B' : 'A'}`)).toBeNull();
    expect(verifyUnsubscribeToken(secret, '7.account.' + 'x'.repeat(43))).toBeNull();
  });

  it('makes RFC 8058 headers', () => {
    const headers = unsubscribeHeaders('https://blockpost.example/', unsubscribeToken(secret, 7, 'receipts'));
    expect(headers['List-Unsubscribe']).toMatch(
      /^<https:\/\/blockpost\.example\/api\/unsubscribe\?token=7\.receipts\.[\w-]{43}>$/,
    );
    expect(headers['List-Unsubscribe-Post']).toBe('List-Unsubscribe=One-Click');
  });
});
