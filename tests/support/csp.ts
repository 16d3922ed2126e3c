// Reads a Content-Security-Policy header as its directives, so a test can say exactly what a
// directive allows (a pattern like /script-src 'self'/ also matches "'self' 'unsafe-inline'").

/** Directive name → its source list. Two policies sent at once, or a directive written twice, throw. */
export function cspDirectives(header: string | null | undefined): Map<string, string[]> {
  if (!header) throw new Error('no Content-Security-Policy header');
  const out = new Map<string, string[]>();
  for (const part of header.split(/[;,]/)) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (!name) continue;
    if (out.has(name.toLowerCase())) throw new Error(`the directive ${name} appears twice in: ${header}`);
    out.set(name.toLowerCase(), sources);
  }
  return out;
}
