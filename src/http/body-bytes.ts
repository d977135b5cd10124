import { errorCodes, type FastifyInstance, type FastifySchemaCompiler } from 'fastify';
import { validatorCompiler } from 'fastify-type-provider-zod';

/**
 * Makes the calling plugin's routes receive a JSON body as its bytes (a Buffer), undecoded and unparsed: the routes
 * that take a schedule hand the bytes to a worker thread (see `readSchedule`), since decoding, parsing and validating
 * a body at the vertex limit on the service thread would hold every other request for a second or more. An empty
 * body is refused as the framework's own JSON parser refuses it. Encapsulated: other plugins keep the framework's
 * parser.
 */
export function keepJsonBodyBytes(app: FastifyInstance): void {
  app.removeContentTypeParser('application/json');
  app.addContentTypeParser('application/json', { parseAs: 'buffer' }, (_request, body, done) => {
    if (body.length === 0) done(new errorCodes.FST_ERR_CTP_EMPTY_JSON_BODY(), undefined);
    else done(null, body);
  });
}

/**
 * Validator compiler of a route whose body is read in a worker: the body (bytes) passes through, to be validated there
 * against the same schema, which the route still declares for its OpenAPI description; headers, query and
 * parameters are validated as everywhere else.
 */
export const validateAllButBody: FastifySchemaCompiler<unknown> = (route) =>
  route.httpPart === 'body' ? (data: unknown) => ({ value: data }) : validatorCompiler(route as never);
