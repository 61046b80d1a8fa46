/** CSV text fields per RFC 4180 §2: quoted when they hold the delimiter, a quote or a line break. */
export function csvField(text: string, delimiter = ','): string {
  return text.includes(delimiter) || /["\r\n]/.test(text) || text !== text.trim() ? `"${text.replace(/"/g, '""')}"` : text;
}
