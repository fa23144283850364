/**
 * Escaping of text placed in HTML and SVG: statement descriptions, labels and names come
 * from files and people and may contain markup (`<script>`, quotes that would end an
 * attribute). Everything the report shows passes through here.
 */

const ENTITIES: Readonly<Record<string, string>> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

/**
 * Text safe inside an element or a quoted attribute. Control characters other than tab,
 * line feed and carriage return (not allowed in HTML text) become U+FFFD.
 * @example escapeHtml('<script>alert("x")</script>') // '&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;'
 */
export function escapeHtml(text: string): string {
  return (
    String(text)
      .replace(/[&<>"']/g, (c) => ENTITIES[c] as string)
      // eslint-disable-next-line no-control-regex -- finding control characters is the point
      .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/g, '\uFFFD')
  );
}
