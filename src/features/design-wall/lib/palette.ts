/** Colours the wall shows the setting in, each with the words said beside it. */
export const SETTING_COLOURS = {
  sashing: { hex: '#ece5d6', name: 'undyed linen' },
  cornerstones: { hex: '#c8920f', name: 'weld yellow' },
  plain: { hex: '#fffdf8', name: 'plain cream' },
  borders: [
    { hex: '#2f4b7c', name: 'indigo' },
    { hex: '#b5462f', name: 'madder red' },
    { hex: '#5f7a5a', name: 'lichen green' },
    { hex: '#6b3f69', name: 'plum' },
  ],
} as const;

export const borderColour = (i: number) => SETTING_COLOURS.borders[i % SETTING_COLOURS.borders.length]!;
