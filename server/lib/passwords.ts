import { hash, verify } from '@node-rs/argon2'

// argon2id (the library's default algorithm) with OWASP's recommended minimum cost: m = 19 MiB, t = 2, p = 1.
const OPTIONS = { memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const

export function hashPassword(password: string): Promise<string> {
  return hash(password, OPTIONS)
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password)
  } catch {
    return false
  }
}

/** A hash to verify against when the account does not exist, so timing does not reveal which part was wrong. */
let dummy: Promise<string> | undefined
export function dummyHash(): Promise<string> {
  dummy ??= hashPassword('no-such-account-placeholder-password')
  return dummy
}
