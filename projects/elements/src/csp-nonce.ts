/**
 * The nonce the host page gives its styles, so the widgets' own `<style>` elements pass a
 * strict Content-Security-Policy. Taken, in order, from an element carrying Angular's
 * `ngCspNonce` attribute, then from any `<link>`, `<style>` or `<script>` with a `nonce`
 * (read through the `nonce` property: browsers hide the attribute's value once parsed).
 */
export function hostCspNonce(doc: Document): string | null {
  const marked = doc.querySelector('[ngCspNonce], [ngcspnonce]');
  const fromAttribute = marked?.getAttribute('ngCspNonce');
  if (fromAttribute) return fromAttribute;
  for (const el of Array.from(doc.querySelectorAll<HTMLElement>('link, style, script'))) {
    if (el.nonce) return el.nonce;
  }
  return null;
}
