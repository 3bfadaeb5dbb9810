/**
 * HTML escaping. Everything that comes from an input file (labels, keys, values, file names) goes through
 * `escapeHtml` before it is placed in the page, in text or in an attribute value (always double-quoted).
 */

const ENTITIES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** Text safe inside an element or a double-quoted attribute, in HTML and in inline SVG. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ENTITIES[c]!);
}

/** A token safe as an id or class fragment: lower-case letters, digits and dashes only. */
export function idToken(text: string): string {
  const t = text.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '');
  return t || 'x';
}
