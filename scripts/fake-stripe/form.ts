// Stripe's SDK sends request bodies as application/x-www-form-urlencoded with bracketed keys
// (metadata[workspaceId]=…, line_items[0][price_data][currency]=eur); this turns them back
// into nested objects and arrays.
export type FormValue = string | FormValue[] | { [key: string]: FormValue };

export function parseStripeForm(body: string): Record<string, FormValue> {
  const root: Record<string, FormValue> = {};
  for (const [rawKey, value] of new URLSearchParams(body)) {
    const parts = rawKey.split(/\[|\]\[|\]/).filter((p, i) => p !== '' || i === 0);
    let node: Record<string, FormValue> | FormValue[] = root;
    parts.forEach((part, i) => {
      const last = i === parts.length - 1;
      const key = Array.isArray(node) ? Number(part) : part;
      const container = node as Record<string | number, FormValue>;
      if (last) {
        container[key] = value;
        return;
      }
      if (container[key] === undefined) container[key] = /^\d+$/.test(parts[i + 1]) ? [] : {};
      node = container[key] as Record<string, FormValue> | FormValue[];
    });
  }
  return root;
}
