import helmet from 'helmet';

/**
 * helmet with a Content Security Policy that allows only our own origin. Styles also allow
 * 'unsafe-inline' because Plotly writes inline styles (docs/decisions/005-sessions-csrf-and-auth.md);
 * scripts never do: no inline scripts anywhere. Fonts and images may be data: URLs (Vite inlines
 * small assets; Plotly exports charts as data: images).
 */
export function securityHeaders(production: boolean) {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'"],
        styleSrc: ["'self'", "'unsafe-inline'"],
        imgSrc: ["'self'", 'data:', 'blob:'],
        fontSrc: ["'self'", 'data:'],
        connectSrc: ["'self'"],
        workerSrc: ["'self'", 'blob:'],
        objectSrc: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
        scriptSrcAttr: ["'none'"],
        ...(production ? { upgradeInsecureRequests: [] } : {}),
      },
    },
    // HSTS only where the site is served over TLS.
    strictTransportSecurity: production ? { maxAge: 15_552_000, includeSubDomains: true } : false,
  });
}
