// Stamps the socket address of every incoming HTTP request on the request's headers (PEER_HEADER),
// before Next sees it, so route handlers can learn where a request really came from
// (lib/http/client-address.ts). Next 16 gives route handlers no socket; this is the one place that
// still has it. A value a client sent under the same name is replaced, never trusted.
import http from "node:http";
import { PEER_HEADER } from "./client-address";

const g = globalThis as unknown as { __cairnPeerAddress?: boolean };

export function installPeerAddress(): void {
  if (g.__cairnPeerAddress) return;
  g.__cairnPeerAddress = true;
  const proto = http.Server.prototype as unknown as { emit: (event: string | symbol, ...args: unknown[]) => boolean };
  const emit = proto.emit;
  proto.emit = function (this: http.Server, event: string | symbol, ...args: unknown[]) {
    if (event === "request" || event === "checkContinue" || event === "checkExpectation") {
      const req = args[0] as http.IncomingMessage;
      req.headers[PEER_HEADER] = req.socket?.remoteAddress ?? "";
    }
    return emit.call(this, event, ...args);
  };
}
