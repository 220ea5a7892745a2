// Password strength by zxcvbn-ts with its common-password and keyboard dictionaries: refuses common passwords,
// repeats (1111111111), sequences and keyboard runs. Shared by the forms and the server through the zod schema.
import { ZxcvbnFactory } from "@zxcvbn-ts/core";
import { adjacencyGraphs, dictionary } from "@zxcvbn-ts/language-common";

/** zxcvbn's scale runs 0–4; 3 is "safely unguessable: moderate protection from offline slow-hash scenario". */
const LEAST_SCORE = 3;

let zxcvbn: ZxcvbnFactory | undefined;

/** Why the password is too easy to guess, or null when it is strong enough. */
export function passwordWeakness(password: string): string | null {
  zxcvbn ??= new ZxcvbnFactory({ dictionary: { ...dictionary }, graphs: adjacencyGraphs });
  const result = zxcvbn.check(password);
  if (result.score >= LEAST_SCORE) return null;
  return "This password is too easy to guess: avoid common words, repeats and sequences, or add a few more words.";
}
