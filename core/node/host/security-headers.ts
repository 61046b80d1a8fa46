/**
 * The content security policy and companion headers of the window, the same in browser mode and
 * in the Electron window. Nothing may load from anywhere but the app itself.
 *
 * style-src allows 'unsafe-inline' because plotly.js writes its own <style> rules at run time:
 * in Chromium under style-src 'self' it logs "Cannot addRelatedStyleRule, probably due to strict
 * CSP" and its stacked plot layers lose `position: absolute`, so the plot falls apart. Inline
 * styles cannot run code; scripts stay strictly 'self', which is where the risk lies.
 */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  "script-src 'self'",
  "style-src 'self' 'unsafe-inline'",
  "connect-src 'self'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "object-src 'none'",
  "frame-ancestors 'none'",
  "base-uri 'none'",
  "form-action 'none'",
].join('; ');

/** Headers on every response the app serves. */
export const SECURITY_HEADERS: Readonly<Record<string, string>> = {
  'Content-Security-Policy': CONTENT_SECURITY_POLICY,
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'no-referrer',
  'X-Frame-Options': 'DENY',
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Cross-Origin-Resource-Policy': 'same-origin',
};
