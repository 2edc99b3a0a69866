// Which new passwords are accepted (ASVS 4.0 2.1.1, 2.1.2, 2.1.7, 2.1.9): 12 to 128 characters of anything, and not
// one that an attacker tries early. zxcvbn-ts estimates the guesses from its shipped lists — about 30,000 passwords
// most common in published breaches, English words and names — plus patterns (repeats, sequences, keyboard rows,
// dates) and the person's own e-mail and name. No network call; no rules about character classes.
import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import * as common from '@zxcvbn-ts/language-common';
import * as english from '@zxcvbn-ts/language-en';
import { badRequest } from './http-error';
import { MAX_PASSWORD_LENGTH, MIN_PASSWORD_LENGTH } from '../../shared/schemas/account';

/** zxcvbn's score 3: at least 10^8 guesses, "safely unguessable" against online guessing with throttling. */
const MIN_SCORE = 3;

let estimator: ZxcvbnFactory | null = null;
function zxcvbn() {
  estimator ??= new ZxcvbnFactory({
    dictionary: { ...common.dictionary, ...english.dictionary },
    graphs: common.adjacencyGraphs,
    translations: english.translations,
  });
  return estimator;
}

/** The person's own words: the e-mail, its parts, and the name. */
function personalWords(person: { email: string; name?: string | null }): string[] {
  const [local, domain = ''] = person.email.toLowerCase().split('@');
  const words = [person.email.toLowerCase(), local, ...local.split(/[._+-]+/), domain.split('.')[0]];
  if (person.name) words.push(person.name.toLowerCase(), ...person.name.toLowerCase().split(/\s+/));
  return [...new Set(words.filter((w) => w.length >= 3))];
}

export type PasswordAssessment = {
  /** zxcvbn's 0–4; 3 and up is accepted. */
  score: number;
  /** Why it is refused, in words for the form; null when it is fine. */
  problem: string | null;
};

/** How the password fares against the rule, for the form's meter and for the server's own check. */
export function assessPassword(password: string, person: { email: string; name?: string | null }): PasswordAssessment {
  if (password.length > MAX_PASSWORD_LENGTH)
    return { score: 0, problem: `Use at most ${MAX_PASSWORD_LENGTH} characters.` };
  const lower = password.toLowerCase();
  if (personalWords(person).some((w) => w.length >= 5 && lower.includes(w) && w.length * 2 >= password.length)) {
    return { score: 0, problem: 'Do not use your own e-mail address or name as the password.' };
  }
  const result = zxcvbn().check(password, personalWords(person));
  if (password.length < MIN_PASSWORD_LENGTH)
    return { score: Math.min(result.score, 2), problem: `Use at least ${MIN_PASSWORD_LENGTH} characters.` };
  if (result.score >= MIN_SCORE) return { score: result.score, problem: null };
  const why = result.feedback.warning ?? 'This password is easy to guess.';
  return {
    score: result.score,
    problem: `${why.replace(/\.?$/, '.')} Choose another: a few unrelated words make a good password.`,
  };
}

/** Why the password is refused, in words for the form, or null when it is fine. */
export function passwordProblem(password: string, person: { email: string; name?: string | null }): string | null {
  return assessPassword(password, person).problem;
}

/** Throws 400 with the reason on `field` when the password is not acceptable. */
export function assertAcceptablePassword(
  password: string,
  person: { email: string; name?: string | null },
  field = 'password',
): void {
  const problem = passwordProblem(password, person);
  if (problem) throw badRequest('Choose a different password.', { [field]: problem });
}
