/**
 * The access log: one line per request at info, written when the response has been sent, with the
 * request (method, URL, host, remote address), the status and the response time in ms — fastify's
 * default writes two (one on arrival, one on completion), which doubles the log volume and its cost
 * per request at the default level. The arrival line is kept at debug, for following a request that
 * has not finished yet. Errors and the other internal lines are logged as fastify logs them.
 */
import { LogController, type FastifyReply, type FastifyRequest } from 'fastify';

export class AccessLog extends LogController {
  override incomingRequest(request: FastifyRequest): void {
    if (this.isLogDisabled(request)) return;
    request.log.debug({ req: request }, 'incoming request');
  }

  override requestCompleted(error: Error | null | undefined, request: FastifyRequest, reply: FastifyReply): void {
    if (this.isLogDisabled(request)) return;
    if (error) {
      super.requestCompleted(error, request, reply);
      return;
    }
    reply.log.info({ req: request, res: reply, responseTime: reply.elapsedTime }, 'request completed');
  }
}
