import { randomInt } from 'node:crypto'

// A run's tag code: ten characters of Crockford's base-32 alphabet (no I, L, O or U, so nothing is
// misread off a weathered label), random, about 50 bits: unguessable, and short enough to type.
const ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ'

export function newTagCode(): string {
  return Array.from({ length: 10 }, () => ALPHABET[randomInt(ALPHABET.length)]).join('')
}

/** A code as typed (lower case, with I/L read as 1 and O as 0, spaces or dashes between groups) in its stored form. */
export function normaliseTagCode(typed: string): string {
  return typed.toUpperCase().replace(/[\s-]/g, '').replace(/[IL]/g, '1').replace(/O/g, '0')
}

export const TAG_CODE_PATTERN = /^[0-9A-HJKMNP-TV-Z]{10}$/
