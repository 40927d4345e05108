// Colours of the operations' limit lines on the conditions charts, and the dark-mode switch they
// follow. Outside the lazily loaded chart module so the key beside the charts can use them too.
import { LINE_COLOURS } from '../../../lib/line-colours';

/** Light and dark colour of each numbered operation; the number is always written beside it. */
export const OPERATION_COLOURS: [string, string][] = LINE_COLOURS;

export const operationColour = (n: number, dark: boolean) => OPERATION_COLOURS[(n - 1) % OPERATION_COLOURS.length][dark ? 1 : 0];
