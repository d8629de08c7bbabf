/// <reference path="../.astro/types.d.ts" />

declare namespace App {
  /**
   * Filled by src/middleware.ts on every request: the signed-in user and their practice, or nulls.
   * Everything the app reads is scoped by `practice.id`.
   */
  interface Locals {
    user: import('./lib/server/auth').SessionUser | null;
    session: import('lucia').Session | null;
    practice: import('./lib/db/practices').Practice | null;
  }
}
