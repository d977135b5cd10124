/** The service version, reported by /healthz and in OpenAPI. Kept in step with package.json by a test. */
export const SERVICE_VERSION = '0.1.0';
