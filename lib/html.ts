/** Escapes text for HTML element content and double-quoted attribute values (mail, the local inbox, SVG). */
export function escapeHtml(text: string) {
  return text.replace(/[&<>"]/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' })[c]!);
}
