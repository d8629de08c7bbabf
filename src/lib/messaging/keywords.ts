/**
 * Reply keywords owners may text back. The opt-out and help words follow the US wireless industry's
 * messaging guidelines (CTIA Messaging Principles and Best Practices) and the FCC's list of reasonable
 * ways to revoke consent (47 CFR 64.1200(a)(10)); START and UNSTOP opt back in.
 */

export type Keyword = 'stop' | 'start' | 'help';

export const STOP_WORDS = ['STOP', 'STOPALL', 'UNSUBSCRIBE', 'CANCEL', 'END', 'QUIT', 'REVOKE', 'OPTOUT'] as const;
export const START_WORDS = ['START', 'UNSTOP'] as const;
export const HELP_WORDS = ['HELP', 'INFO'] as const;

/**
 * The keyword a reply is, or null for an ordinary reply. The whole reply must be the word (any case,
 * surrounding spaces and trailing punctuation ignored; "opt out" counts as OPTOUT), so that a
 * sentence such as "please don't stop coming" is kept as a reply rather than read as an opt-out.
 */
export function keywordOf(body: string): Keyword | null {
  const word = body
    .trim()
    .toUpperCase()
    .replace(/[.!?,;:'"\s]+$/u, '')
    .replace(/^OPT[\s-]+OUT$/, 'OPTOUT');
  if ((STOP_WORDS as readonly string[]).includes(word)) return 'stop';
  if ((START_WORDS as readonly string[]).includes(word)) return 'start';
  if ((HELP_WORDS as readonly string[]).includes(word)) return 'help';
  return null;
}
