import type { AuthSession, AuthUser } from '$lib/server/auth';

declare global {
  namespace App {
    interface Error {
      message: string;
      id?: string;
    }
    interface Locals {
      user: AuthUser | null;
      session: AuthSession | null;
      /** How the request was authenticated: a session cookie or a personal API token. */
      via: 'cookie' | 'token' | null;
      requestId: string;
    }
  }
}

export {};
