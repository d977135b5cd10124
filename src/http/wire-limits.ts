/**
 * Size limits of one request, stated in the OpenAPI description and in api-spec/errors.md. They keep one schedule's
 * geometry work bounded on a shared 2-core machine.
 */
export const WIRE_LIMITS = Object.freeze({
  /** Largest request body, bytes (413 beyond). */
  bodyBytes: 5 * 1024 * 1024,
  /** Most stations in one schedule. */
  stations: 500,
  /** Most vertices in one ring. */
  ringVertices: 5000,
  /** Most holes in one orifice. */
  holes: 50,
  /** Most vertices over the whole schedule. */
  totalVertices: 200_000,
  /** Largest absolute coordinate, mm (the die-body frame is at most a couple of metres across). */
  coordinateMm: 2000,
});
