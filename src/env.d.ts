/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    user: import('lucia').User | null;
    session: import('lucia').Session | null;
    /** The TCP peer's address, set by our HTTP server (src/lib/server/runtime/http-server.mjs); absent under `astro dev`. */
    peerAddress?: string;
    /** Whether the peer connected over TLS (our server does not terminate TLS: normally false). */
    peerEncrypted?: boolean;
    /** Set when the request authenticated with a personal API token (`Authorization: Bearer …`). */
    token: { id: string; scope: 'read' | 'write' } | null;
  }
}
