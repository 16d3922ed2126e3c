const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** A tiny self-contained HTML page for unknown, closed or full links (sent with its 404/410/409 status). */
export function plainPage(title: string, message: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1"><meta name="robots" content="noindex"><title>${esc(title)}</title>
<style>body{margin:0;background:#FAF7F2;color:#1F2430;font:1.125rem/1.6 system-ui,sans-serif}main{max-width:28rem;margin:0 auto;padding:4rem 1.25rem;text-align:center}h1{font-family:Georgia,serif;font-weight:600;font-size:1.75rem;margin:0 0 1rem}</style>
</head><body><main><h1>${esc(title)}</h1><p>${esc(message)}</p></main></body></html>`;
}
