import { createRequire } from 'node:module';

/** Helmet's middleware as @fastify/helmet calls it (the library that plugin wraps, loaded as its dependency). */
type HelmetMiddleware = (
  req: unknown,
  res: { setHeader(name: string, value: string): void; removeHeader(name: string): void },
  next: (err?: unknown) => void,
) => void;

const helmet = createRequire(createRequire(import.meta.url).resolve('@fastify/helmet'))('helmet') as (
  options: object,
) => HelmetMiddleware;

/**
 * The security headers helmet sets for `options`, worked out once. @fastify/helmet builds helmet's whole middleware
 * (its content security policy parsed again) on every request; the headers depend only on the options, so the
 * service sets these on each response instead: the same headers at a fraction of the cost.
 */
export function securityHeaders(options: object): readonly (readonly [name: string, value: string])[] {
  const headers = new Map<string, string>();
  helmet(options)(
    {},
    {
      setHeader: (name, value) => headers.set(name, String(value)),
      removeHeader: (name) => headers.delete(name),
    },
    (err) => {
      if (err) throw err;
    },
  );
  return [...headers];
}
