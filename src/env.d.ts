/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    user: import('./server/auth/types.ts').SessionUser | null;
    session: import('./server/auth/types.ts').SessionInfo | null;
  }
}
