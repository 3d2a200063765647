import { hash, verify } from '@node-rs/argon2'

// argon2id with the OWASP-recommended minimum (19 MiB, t=2, p=1).
const OPTIONS = { memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 }

export function hashPassword(password: string): Promise<string> {
  return hash(password, OPTIONS)
}

export async function verifyPassword(hashed: string, password: string): Promise<boolean> {
  try {
    return await verify(hashed, password)
  }
  catch {
    return false
  }
}

/** A fixed hash so a sign-in with an unknown e-mail costs the same time as a wrong password. */
let dummyHash: Promise<string> | undefined
export function dummyPasswordHash(): Promise<string> {
  dummyHash ??= hash('pastload-timing-equaliser', OPTIONS)
  return dummyHash
}
