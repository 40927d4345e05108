// Colours of the operations' limit lines on the conditions charts, and the dark-mode switch they
// follow. Outside the lazily loaded chart module so the key beside the charts can use them too.

/** Light and dark colour of each numbered operation; the number is always written beside it. */
export const OPERATION_COLOURS: [string, string][] = [
  ['#c2410c', '#fb923c'],
  ['#7c3aed', '#c4b5fd'],
  ['#0369a1', '#7dd3fc'],
  ['#be185d', '#f9a8d4'],
  ['#4d7c0f', '#bef264'],
  ['#a16207', '#fde047'],
];

export const operationColour = (n: number, dark: boolean) => OPERATION_COLOURS[(n - 1) % OPERATION_COLOURS.length][dark ? 1 : 0];
