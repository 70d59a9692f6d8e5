import bcrypt from 'bcryptjs'

/** OWASP ASVS 2.4.4 asks for a high work factor; 12 keeps sign-in under half a second here. */
export const BCRYPT_COST = 12

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST)
}

export function verifyPassword(password: string, hash: string | null): Promise<boolean> {
  // Compare against a dummy hash when there is none, so unknown accounts take as long as known ones.
  return bcrypt.compare(password, hash ?? DUMMY_HASH)
}

const DUMMY_HASH = '$2b$12$xNpUdIJr3Al9nOnKmkwyU.5kyNB40P4GrDQJs8qrAt2aLITlrucKO'
