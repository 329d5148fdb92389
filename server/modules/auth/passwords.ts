import bcrypt from 'bcryptjs'
import { runtimeMode } from '../../env'

/** Cost 12: about 0.25 s a hash on this machine; OWASP asks for at least 10 (common practice). */
export const BCRYPT_COST = runtimeMode() === 'test' ? 10 : 12

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST)
}

// A real hash of a random string: comparing against it costs as much as a real check, so an unknown
// e-mail takes as long to refuse as a wrong password and timing does not tell them apart.
const DUMMY_HASH = bcrypt.hashSync(`no-such-user-${Math.random()}`, BCRYPT_COST)

export async function verifyPassword(password: string, hash: string | undefined): Promise<boolean> {
  if (!hash) {
    await bcrypt.compare(password, DUMMY_HASH)
    return false
  }
  return bcrypt.compare(password, hash)
}
