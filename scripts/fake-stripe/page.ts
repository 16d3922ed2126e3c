// The stand-in checkout page: plain HTML in a neutral look of its own.
import type { CheckoutSession } from './sessions';

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function money(cents: number, currency: string) {
  return new Intl.NumberFormat('en-IE', { style: 'currency', currency: currency.toUpperCase() }).format(cents / 100);
}

export function checkoutPage(s: CheckoutSession): string {
  const lines = s.line_items_summary.map((i) => `<tr><td>${esc(i.name)}</td><td class="n">${i.quantity}</td><td class="n">${money(i.unit_amount * i.quantity, s.currency)}</td></tr>`).join('');
  const open = s.status === 'open';
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>Test checkout</title>
<style>
body{font-family:system-ui,sans-serif;background:#f4f4f1;color:#222;margin:0;padding:40px 16px}
main{max-width:440px;margin:0 auto;background:#fff;border:1px solid #ccc;padding:24px}
h1{font-size:20px;margin:0 0 4px} p.note{color:#666;font-size:13px;margin:0 0 16px}
table{width:100%;border-collapse:collapse;margin:12px 0} td{padding:6px 0;border-bottom:1px solid #e5e5e5}
td.n{text-align:right;font-family:monospace} .total td{font-weight:bold;border-bottom:0}
.row{display:flex;gap:8px;margin-top:16px} button{flex:1;font-size:16px;padding:12px;border:1px solid #444;background:#fff;cursor:pointer}
button.pay{background:#333;color:#fff}
</style></head><body><main>
<h1>Test checkout</h1>
<p class="note">Local payment stand-in. No card is charged; nothing leaves this machine.</p>
<div>Billed to: <span data-testid="customer-email">${esc(s.customer_email ?? '—')}</span></div>
<table><tbody>${lines}<tr class="total"><td>Total</td><td></td><td class="n" data-testid="amount">${money(s.amount_total, s.currency)}</td></tr></tbody></table>
${open ? `<div class="row">
<form method="post" action="/checkout/${esc(s.id)}/cancel" style="flex:1;display:flex"><button type="submit">Cancel</button></form>
<form method="post" action="/checkout/${esc(s.id)}/pay" style="flex:1;display:flex"><button type="submit" class="pay">Pay</button></form>
</div>` : `<p>This checkout is ${esc(s.status)}.</p>`}
</main></body></html>`;
}
