/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    user: import('lucia').User | null;
    session: import('lucia').Session | null;
    /** Set when the request authenticated with a personal API token (`Authorization: Bearer …`). */
    token: { id: string; scope: 'read' | 'write' } | null;
  }
}
