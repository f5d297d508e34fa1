/**
 * Security headers (helmet): a strict Content-Security-Policy (scripts from this origin only, no
 * inline script, no eval, never framed by another page), Permissions-Policy, and HSTS when the
 * app is served over https. The built client has no inline script or style element (checked in
 * tests/api/security-headers.test.ts); charts set styles through the CSSOM, and their tooltips use
 * style attributes, which `style-src-attr` allows without allowing inline <style> or script.
 */
import helmet from 'helmet';
import type { RequestHandler } from 'express';

/** Browser features Pullbook never uses, switched off for the page and anything it embeds. */
export const PERMISSIONS_POLICY = [
  'accelerometer=()',
  'autoplay=()',
  'camera=()',
  'display-capture=()',
  'geolocation=()',
  'gyroscope=()',
  'magnetometer=()',
  'microphone=()',
  'midi=()',
  'payment=()',
  'usb=()',
  'xr-spatial-tracking=()',
  'fullscreen=(self)',
].join(', ');

export interface SecurityHeaderOptions {
  publicUrl: string;
  /** Vite's dev server injects an inline preamble and talks over a websocket: relax for it only. */
  devServer?: boolean;
}

export function securityHeaders({ publicUrl, devServer = false }: SecurityHeaderOptions): RequestHandler[] {
  const https = publicUrl.startsWith('https:');
  const scriptSrc = devServer ? ["'self'", "'unsafe-inline'"] : ["'self'"];
  const base = helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        'default-src': ["'self'"],
        'script-src': scriptSrc,
        'script-src-attr': ["'none'"],
        'style-src': devServer ? ["'self'", "'unsafe-inline'"] : ["'self'"],
        'style-src-attr': ["'unsafe-inline'"],
        'img-src': ["'self'", 'data:', 'blob:'],
        'font-src': ["'self'", 'data:'],
        'connect-src': devServer ? ["'self'", 'ws:', 'wss:'] : ["'self'"],
        'worker-src': ["'self'", 'blob:'],
        // The report page shows its own PDF in an <object>.
        'object-src': ["'self'"],
        'frame-src': ["'self'", 'blob:'],
        'frame-ancestors': ["'none'"],
        'base-uri': ["'self'"],
        'form-action': ["'self'"],
        ...(https ? { 'upgrade-insecure-requests': [] } : {}),
      },
    },
    strictTransportSecurity: https ? { maxAge: 365 * 24 * 3600, includeSubDomains: true } : false,
    referrerPolicy: { policy: 'same-origin' },
    xFrameOptions: { action: 'deny' },
    crossOriginEmbedderPolicy: false,
  });
  const permissions: RequestHandler = (_req, res, next) => {
    res.setHeader('Permissions-Policy', PERMISSIONS_POLICY);
    next();
  };
  return [base, permissions];
}

/**
 * A report PDF is shown framed by the app's own report page: it may be framed by this origin
 * (and nothing else), which the page-wide policy forbids.
 */
export const framableBySelf: RequestHandler = (_req, res, next) => {
  res.setHeader('Content-Security-Policy', "default-src 'none'; frame-ancestors 'self'");
  res.setHeader('X-Frame-Options', 'SAMEORIGIN');
  next();
};
