/**
 * Password hashing with argon2id (@node-rs/argon2, native, no install script).
 * Parameters: OWASP Password Storage Cheat Sheet's argon2id minimum (19 MiB, t=2, p=1).
 */
import { hash, verify } from '@node-rs/argon2';

const OPTIONS = {
  algorithm: 2, // Algorithm.Argon2id (a const enum in the typings, so spelled out here)
  memoryCost: 19_456,
  timeCost: 2,
  parallelism: 1
} as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, OPTIONS);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

/** A hash of a random password: verifying against it costs the same as a real one. */
let dummy: Promise<string> | undefined;
export function dummyHash(): Promise<string> {
  dummy ??= hashPassword(crypto.randomUUID());
  return dummy;
}
