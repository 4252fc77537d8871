// Server-rendered HTML with every interpolated value escaped, unless it is already Html (made by this module).
// Device names, seam labels and tags are data, whatever characters they hold.

export class Html {
  constructor(readonly text: string) {}
  toString(): string {
    return this.text;
  }
}

const ESCAPES: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

export const escapeHtml = (value: string): string => value.replace(/[&<>"']/g, (ch) => ESCAPES[ch] as string);

function part(value: unknown): string {
  if (value instanceof Html) return value.text;
  if (Array.isArray(value)) return value.map(part).join('');
  if (value === null || value === undefined || value === false) return '';
  return escapeHtml(String(value));
}

export function html(strings: TemplateStringsArray, ...values: unknown[]): Html {
  let out = strings[0] ?? '';
  values.forEach((value, i) => {
    out += part(value) + (strings[i + 1] ?? '');
  });
  return new Html(out);
}

/** Markup made elsewhere that is known to be safe (the QR code's SVG). */
export const trusted = (text: string): Html => new Html(text);
