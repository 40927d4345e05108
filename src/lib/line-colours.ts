/**
 * Light and dark colour of numbered lines on charts (the operations' limit lines, an RAO table's
 * headings): readable on the light and the night surface. Always used with words, a number or a
 * dash pattern beside the colour, so a chart reads without it.
 */
export const LINE_COLOURS: [string, string][] = [
  ['#c2410c', '#fb923c'],
  ['#7c3aed', '#c4b5fd'],
  ['#0369a1', '#7dd3fc'],
  ['#be185d', '#f9a8d4'],
  ['#4d7c0f', '#bef264'],
  ['#a16207', '#fde047'],
];
