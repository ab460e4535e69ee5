/**
 * Inline styles for the HTML mails (mail programs drop <style> blocks). The palette is the app's:
 * linen background, walnut text, indigo links and buttons; body text 18 px for older eyes.
 */
export const palette = {
  linen: '#F7F3EA',
  linenDeep: '#ECE5D6',
  card: '#FFFDF8',
  walnut: '#2B2118',
  walnutSoft: '#5A4A3C',
  indigo: '#2F4B7C',
  indigoDeep: '#223A63',
  seam: '#CDBFA3',
  // Text-safe variants of the verdict colours (≥ 4.5 : 1 on the card colour).
  lichen: '#435840',
  weld: '#7A5906',
  madder: '#8F3522',
  plum: '#6B3F69',
} as const;

const body = `font-family:'Atkinson Hyperlegible Next','Atkinson Hyperlegible',Verdana,Arial,sans-serif;font-size:18px;line-height:1.55;color:${palette.walnut}`;
const display = `font-family:Fraunces,Georgia,'Times New Roman',serif;color:${palette.indigoDeep}`;

export const styles = {
  page: `margin:0;padding:0;background:${palette.linen};`,
  outer: `background:${palette.linen};padding:24px 12px;`,
  card: `max-width:600px;background:${palette.card};border:1px solid ${palette.linenDeep};border-radius:12px;`,
  // The seam line: a dashed inner rule, as on the app's cards.
  seam: `border:2px dashed ${palette.seam};border-radius:8px;padding:24px 22px;${body}`,
  brand: `${display};font-size:20px;font-weight:bold;margin:0 0 4px;`,
  guild: `margin:0 0 18px;font-size:16px;color:${palette.walnutSoft};`,
  h1: `${display};font-size:27px;line-height:1.25;margin:0 0 16px;font-weight:bold;`,
  h2: `${display};font-size:21px;line-height:1.3;margin:26px 0 8px;font-weight:bold;`,
  p: 'margin:0 0 16px;',
  small: `margin:0 0 10px;font-size:16px;line-height:1.5;color:${palette.walnutSoft};`,
  link: `color:${palette.indigo};text-decoration:underline;`,
  facts: `width:100%;border-collapse:collapse;margin:0 0 18px;background:${palette.linen};border-left:4px solid ${palette.indigo};`,
  factLabel: `padding:8px 12px;font-weight:bold;vertical-align:top;width:38%;${body}`,
  factValue: `padding:8px 12px;vertical-align:top;${body}`,
  table: 'width:100%;border-collapse:collapse;margin:0 0 18px;',
  th: `text-align:left;padding:8px 8px;border-bottom:2px solid ${palette.seam};font-size:16px;${display}`,
  td: `padding:8px 8px;border-bottom:1px solid ${palette.linenDeep};vertical-align:top;${body}`,
  tdNum: `padding:8px 8px;border-bottom:1px solid ${palette.linenDeep};vertical-align:top;text-align:right;white-space:nowrap;${body}`,
  note: `margin:0 0 16px;padding:12px 16px;background:${palette.linen};border-radius:8px;`,
  caution: `margin:0 0 16px;padding:12px 16px;background:${palette.linen};border-left:4px solid ${palette.weld};border-radius:4px;`,
  buttonCell: `background:${palette.indigo};border-radius:8px;`,
  button: `display:inline-block;padding:14px 24px;font-size:18px;font-weight:bold;color:#FFFFFF;text-decoration:none;border-radius:8px;font-family:Verdana,Arial,sans-serif;`,
  footer: `padding:18px 8px 0;font-size:15px;line-height:1.5;color:${palette.walnutSoft};font-family:Verdana,Arial,sans-serif;`,
  verdict_true: `font-weight:bold;color:${palette.lichen};`,
  verdict_trim: `font-weight:bold;color:${palette.weld};`,
  verdict_short: `font-weight:bold;color:${palette.madder};`,
  verdict_skewed: `font-weight:bold;color:${palette.plum};`,
  verdict_none: `color:${palette.walnutSoft};`,
} as const;
