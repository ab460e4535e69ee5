/** QR codes for labels, drawn by the `qrcode` package. */
import QRCode from 'qrcode';

/**
 * Error correction M (about 15 % of the code may be lost: a crease or a pin hole) and a two-module
 * quiet zone; the label's own white edge adds to it.
 */
export const QR_OPTIONS = { errorCorrectionLevel: 'M', margin: 2 } as const;

/** The reference as an SVG data URL: sharp at any print size, allowed by the page's `img-src data:`. */
export async function qrDataUrl(text: string): Promise<string> {
  const svg = await QRCode.toString(text, { ...QR_OPTIONS, type: 'svg', color: { dark: '#000000', light: '#ffffff' } });
  return `data:image/svg+xml;base64,${Buffer.from(svg).toString('base64')}`;
}
