/** The shared frame of account e-mails: a plain-text body and a simple HTML body with one button link. */
import { escapeHtml, type EmailContent } from "../mailer";

export function accountEmail(opts: { subject: string; greeting: string; paragraphs: string[]; action: { label: string; url: string }; footer: string }): EmailContent {
  const text = [opts.greeting, "", ...opts.paragraphs.flatMap((p) => [p, ""]), `${opts.action.label}: ${opts.action.url}`, "", opts.footer, "", "— Tanglebank"].join("\n");
  const html = `<!doctype html><html><body style="font-family:'Noto Sans',Arial,sans-serif;color:#1c1917;max-width:560px">
<p>${escapeHtml(opts.greeting)}</p>
${opts.paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join("\n")}
<p><a href="${escapeHtml(opts.action.url)}" style="display:inline-block;background:#1f4d3a;color:#ffffff;padding:10px 16px;border-radius:4px;text-decoration:none;font-weight:600">${escapeHtml(opts.action.label)}</a></p>
<p style="font-size:13px;color:#57534e">If the button does not work, copy this address into your browser:<br>${escapeHtml(opts.action.url)}</p>
<p style="font-size:13px;color:#57534e">${escapeHtml(opts.footer)}</p>
<p>— Tanglebank</p>
</body></html>`;
  return { subject: opts.subject, text, html };
}
