const SUPERSCRIPT: Record<string, string> = {
  '-': '⁻',
  '0': '⁰',
  '1': '¹',
  '2': '²',
  '3': '³',
  '4': '⁴',
  '5': '⁵',
  '6': '⁶',
  '7': '⁷',
  '8': '⁸',
  '9': '⁹',
};

const formatters = new Map<string, Intl.NumberFormat>();

function formatter(sig: number, fixed: boolean): Intl.NumberFormat {
  const key = `${sig}:${fixed}`;
  let f = formatters.get(key);
  if (!f) {
    f = new Intl.NumberFormat('en-GB', { maximumSignificantDigits: sig, minimumSignificantDigits: fixed ? sig : 1 });
    formatters.set(key, f);
  }
  return f;
}

/**
 * A number to `sig` significant figures for reading: grouped thousands between 0.001 and 10^6,
 * scientific form (2.204 × 10¹³) outside, a true minus sign, an en dash for NaN or missing.
 * `fixed` keeps trailing zeros (0.5000), so the columns of a table line up.
 */
export function formatSig(value: number | null | undefined, sig = 4, fixed = false): string {
  if (value === null || value === undefined || Number.isNaN(value)) return '–';
  if (!Number.isFinite(value)) return value > 0 ? '∞' : '−∞';
  const abs = Math.abs(value);
  let text: string;
  if (value === 0 || (abs >= 1e-3 && abs < 1e6)) {
    text = formatter(sig, fixed).format(value);
  } else {
    const [mantissa, exponent] = value.toExponential(sig - 1).split('e');
    const m = fixed ? mantissa : String(Number(mantissa));
    const e = exponent.replace('+', '').replace(/./g, (c) => SUPERSCRIPT[c] ?? c);
    text = `${m} × 10${e}`;
  }
  return text.replace(/^-/, '−');
}
