// Password rules, one place for every path that sets a password: an administrator creating a
// user or issuing a new temporary password, and a user changing their own.
//
// Length over composition rules, and a refusal of passwords that are trivially guessed: NIST SP
// 800-63B section 5.1.1.2 (memorized secrets: check against commonly used and expected values,
// repetitive or sequential characters, context-specific words; no composition rules), cited from
// memory. The minimum of 12 characters is the OWASP Authentication Cheat Sheet's advice for
// passwords without a second factor (from memory).

/** Fewest characters a password may have. */
export const PASSWORD_MIN_LENGTH = 12;
/** Most characters (the hash function reads the whole text; a megabyte password is a cost, not a secret). */
export const PASSWORD_MAX_LENGTH = 128;

/**
 * Passwords that head every published list of the most used ones (common practice, no source: a
 * short sample from memory, enough to catch the obvious; the length rule does most of the work).
 */
const COMMON = [
  'password',
  'passw0rd',
  'qwerty',
  'qwertyuiop',
  'asdfghjkl',
  'letmein',
  'welcome',
  'iloveyou',
  'admin',
  'administrator',
  'changeme',
  'monkey',
  'dragon',
  'football',
  'baseball',
  'sunshine',
  'princess',
  'trustno1',
  'starwars',
  'lullwatch',
  'secret',
];

const SEQUENCES = ['0123456789', 'abcdefghijklmnopqrstuvwxyz', 'qwertyuiopasdfghjklzxcvbnm'];

/** The password as guessed forms: lower case, digits and symbols at the ends stripped. */
function core(pw: string): string {
  return pw.toLowerCase().replace(/^[^a-z]+|[^a-z]+$/g, '');
}

function isSequence(pw: string): boolean {
  const p = pw.toLowerCase();
  for (const seq of SEQUENCES) {
    const both = [seq, [...seq].reverse().join('')];
    // The whole password is a run of one keyboard or alphabet sequence (possibly repeated).
    for (const s of both) {
      const doubled = s + s + s;
      if (doubled.includes(p)) return true;
    }
  }
  return false;
}

/**
 * Why a password is refused, or null when it is acceptable. `context` holds words an attacker
 * would try first for this account (e-mail, its local part, the name).
 */
export function passwordProblem(password: string, context: { email?: string; name?: string } = {}): string | null {
  if (typeof password !== 'string') return 'must be text';
  if (password.length < PASSWORD_MIN_LENGTH) return `must be at least ${PASSWORD_MIN_LENGTH} characters`;
  if (password.length > PASSWORD_MAX_LENGTH) return `must be at most ${PASSWORD_MAX_LENGTH} characters`;
  if (new Set(password).size < 4) return 'is too repetitive: use at least four different characters';
  if (isSequence(password)) return 'is a keyboard or alphabet sequence';
  const c = core(password);
  const lower = password.toLowerCase();
  for (const word of COMMON) {
    if (c === word || lower === word || new RegExp(`^(${word})+$`).test(c)) return 'is one of the most common passwords';
  }
  const words = [context.email, context.email?.split('@')[0], context.name]
    .filter((w): w is string => typeof w === 'string' && w.trim().length >= 3)
    .map((w) => w.trim().toLowerCase());
  for (const w of words) {
    if (lower === w || c === w.replace(/[^a-z]/g, '')) return 'must not be your e-mail address or name';
  }
  return null;
}
