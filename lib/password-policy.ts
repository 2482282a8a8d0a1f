import 'server-only';
import { dictionary } from '@zxcvbn-ts/language-common';

/**
 * The most common passwords are refused. The list is the one @zxcvbn-ts/language-common ships (MIT; about
 * 49,000 passwords from public breach corpora, ranked by frequency), read from the installed package: nothing is
 * fetched at run time. Compared case-insensitively, so "Password1234" counts as "password1234".
 */
export const COMMON_PASSWORD_MESSAGE =
  'This password is one of the most common ones, which attackers try first. Choose another (a few unrelated words work well).';

let common: Set<string> | undefined;

export function isCommonPassword(password: string): boolean {
  common ??= new Set(dictionary['passwords-common'].map((p) => p.toLowerCase()));
  return common.has(password.trim().toLowerCase());
}

export function commonPasswordCount(): number {
  isCommonPassword('');
  return common!.size;
}
