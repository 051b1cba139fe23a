/**
 * The content security policy of every HTML page the service serves (the lab's page at `/`
 * and the API reference at `/docs`): only our own files may run or style a page; API calls
 * and figures stay on this origin; figures arrive as blob: images. Nothing may frame a page.
 */
export const PAGE_CONTENT_SECURITY_POLICY = [
  "default-src 'none'",
  "script-src 'self'",
  "style-src 'self'",
  "img-src 'self' blob: data:",
  "connect-src 'self'",
  "manifest-src 'self'",
  "base-uri 'none'",
  "form-action 'none'",
  "frame-ancestors 'none'"
].join('; ')
