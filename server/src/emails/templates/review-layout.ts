/** The frame of review e-mails: plain text and simple HTML with one button link. */
import { escapeHtml, type EmailContent } from "../mailer";

export function reviewEmail(opts: { subject: string; greeting: string; paragraphs: string[]; quote?: { label: string; text: string }; action: { label: string; url: string } }): EmailContent {
  const quoteText = opts.quote ? [`${opts.quote.label}:`, ...opts.quote.text.split("\n").map((l) => `> ${l}`), ""] : [];
  const text = [opts.greeting, "", ...opts.paragraphs.flatMap((p) => [p, ""]), ...quoteText, `${opts.action.label}: ${opts.action.url}`, "", "— Tanglebank"].join("\n");
  const html = `<!doctype html><html><body style="font-family:'Noto Sans',Arial,sans-serif;color:#1c1917;max-width:560px">
<p>${escapeHtml(opts.greeting)}</p>
${opts.paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join("\n")}
${opts.quote ? `<p><strong>${escapeHtml(opts.quote.label)}:</strong></p><blockquote style="border-left:4px solid #e9c46a;margin:0;padding:4px 12px;white-space:pre-wrap">${escapeHtml(opts.quote.text)}</blockquote>` : ""}
<p><a href="${escapeHtml(opts.action.url)}" style="display:inline-block;background:#1f4d3a;color:#ffffff;padding:10px 16px;border-radius:4px;text-decoration:none;font-weight:600">${escapeHtml(opts.action.label)}</a></p>
<p style="font-size:13px;color:#57534e">If the button does not work, copy this address into your browser:<br>${escapeHtml(opts.action.url)}</p>
<p>— Tanglebank</p>
</body></html>`;
  return { subject: opts.subject, text, html };
}
