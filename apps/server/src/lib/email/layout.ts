/** The HTML every Emberline message shares: paragraphs, a link, and an optional caution. */
export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (char) => `&#${char.charCodeAt(0)};`);
}

export function mailLayout(
  paragraphs: string[],
  link: { href: string; label: string },
  caution?: string,
): string {
  const body = paragraphs.map((text) => `<p>${escapeHtml(text)}</p>`).join('');
  const note = caution ? `<p style="font-size:12px;color:#57534e">${escapeHtml(caution)}</p>` : '';
  return `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1c1917">${body}<p><a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a></p>${note}</body></html>`;
}
