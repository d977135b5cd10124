import { randomUUID } from 'node:crypto';
import { STATUS_CODES } from 'node:http';
import type { Duplex } from 'node:stream';
import { ERROR_CATALOGUE, type ErrorCode, errorBody } from './error-catalogue.js';

/** What `clientErrorAnswer` logs: one line per answered connection. */
export type ClientErrorLog = (fields: Record<string, unknown>, message: string) => void;

/**
 * The answer to an error Node's HTTP parser meets before there is a request to route (fastify's `clientErrorHandler`):
 * a request whose headers and body did not all arrive within `requestTimeoutMs` (408 `request_timeout`), headers larger
 * than Node's limit (431 `headers_too_large`), or bytes that are not an HTTP/1.1 request (400 `malformed_request`).
 * Written on the bare socket in the catalogue's shape, with a request id of its own; the connection is then closed.
 */
export function clientErrorAnswer(requestTimeoutMs: number, log: ClientErrorLog) {
  return (error: NodeJS.ErrnoException, socket: Duplex): void => {
    // a connection the client reset, or one already closed, has no one to answer
    if (error.code === 'ECONNRESET' || socket.destroyed) return;
    const [code, message] = describe(error.code, requestTimeoutMs);
    const requestId = randomUUID();
    log({ request_id: requestId, error: error.code, answered: code }, 'client error answered');
    // as Node does without a handler: answer only when no response has begun on this connection (a route may have
    // answered before the client finished sending), so the client never reads two responses mixed
    const inFlight = (socket as { _httpMessage?: { headersSent?: boolean } })._httpMessage;
    if (socket.writable && !inFlight?.headersSent) {
      const status = ERROR_CATALOGUE[code].status;
      const body = JSON.stringify({ ...errorBody(code, message), request_id: requestId });
      socket.write(
        `HTTP/1.1 ${status} ${STATUS_CODES[status]}\r\nContent-Type: application/json; charset=utf-8\r\n` +
          `Content-Length: ${Buffer.byteLength(body)}\r\nX-Request-Id: ${requestId}\r\nConnection: close\r\n\r\n${body}`,
      );
    }
    socket.destroy(error);
  };
}

function describe(code: string | undefined, requestTimeoutMs: number): [ErrorCode, string] {
  if (code === 'ERR_HTTP_REQUEST_TIMEOUT') {
    return [
      'request_timeout',
      `The request's headers and body did not all arrive within ${requestTimeoutMs / 1000} s; the connection is closed.`,
    ];
  }
  if (code === 'HPE_HEADER_OVERFLOW') {
    return ['headers_too_large', 'The request headers are larger than the service reads (16 KiB in all).'];
  }
  return ['malformed_request', 'The request cannot be read as HTTP/1.1: check the request line and the headers.'];
}
