import { readFileSync } from 'node:fs'
import { passwordLength, passwordRuleProblem } from '#shared/schemas/account'

const LIST_FILE = new URL('./common-passwords.txt', import.meta.url)

let common: Set<string> | undefined

/** The shipped list of very common passwords (see the file's header for its source), lower-cased; read once. */
export function commonPasswords(): Set<string> {
  common ??= new Set(
    readFileSync(LIST_FILE, 'utf8')
      .split(/\r?\n/)
      .filter((line) => line.trim() !== '' && !line.startsWith('#'))
      .map((line) => line.toLowerCase()),
  )
  return common
}

/** The password without digits, symbols and spaces at either end: "Sunshine2024!!" → "sunshine". */
function core(password: string): string {
  return password.toLowerCase().replace(/^[^\p{L}]+|[^\p{L}]+$/gu, '')
}

/**
 * Why a new password is refused, as the message for `fields.password`, or null when it is acceptable.
 * NIST SP 800-63B sec. 5.1.1.2: a minimum length, no composition rules, and refusing values that are "commonly-used,
 * expected, or compromised", including "repetitive or sequential characters" and "context-specific words" such as
 * the user name; OWASP ASVS 4.0.3 2.1.1, 2.1.2 and 2.1.7 set the lengths (see shared/schemas/account.ts).
 */
export function passwordProblem(password: string, email?: string | null): string | null {
  const rule = passwordRuleProblem(password, email)
  if (rule) return rule
  const list = commonPasswords()
  const lower = password.toLowerCase()
  if (list.has(lower) || list.has(lower.replace(/\s+/g, '')) || list.has(core(password))) {
    return 'This password is on the list of very common passwords; choose another'
  }
  if (new Set(lower).size < 4 || passwordLength(password) < 4) return 'Use more different characters'
  return null
}
