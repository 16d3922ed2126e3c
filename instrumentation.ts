// Runs once per server process before it answers requests (Next.js instrumentation hook).
// It stamps each request with the socket's address, which Next.js does not hand to route
// handlers: see lib/peer-stamp.ts for why and how. The import sits behind the runtime check so
// the edge build never sees node:http.
export async function register() {
  if (process.env.NEXT_RUNTIME === 'nodejs') {
    const { installPeerStamp } = await import('./lib/peer-stamp');
    installPeerStamp();
  }
}
