/** The colour engine: sRGB to CIE L*a*b* (D65), CIEDE2000 differences and the colour-spreading layout. */
export { deltaE2000, greyForLightness, linearRgbToLab, parseHex, rgbToLab, srgbChannelToLinear, srgbToLab } from './lab';
export type { Lab } from './lab';
export { arrangeByColour, arrangementScore, neighbourCells, seededRandom } from './arrange';
export type { ArrangeInput, ArrangeResult } from './arrange';
export { colourStatistics } from './statistics';
export type { ColourStatistics } from './statistics';
