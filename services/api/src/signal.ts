import type { FastifyReply, FastifyRequest } from 'fastify';

/**
 * Fires when the client goes away before the answer is written. Listens on the response, not the
 * request: the request's 'close' fires as soon as its body has been read.
 */
export function clientGone(reply: FastifyReply): AbortSignal {
  const ac = new AbortController();
  reply.raw.on('close', () => {
    if (!reply.raw.writableFinished) ac.abort(new DOMException('the client went away', 'AbortError'));
  });
  return ac.signal;
}

/** The signal a request's work stops on: its client going away, or the service shutting down. */
export function requestSignal(reply: FastifyReply, shutdown: AbortSignal): AbortSignal {
  return AbortSignal.any([clientGone(reply), shutdown]);
}

/**
 * Whose work a request's pool tasks are: the key's id ('' without keys, as a schedule job's owner
 * is) and the request. The pool's queue takes flows in turns, owners first, so a synchronous
 * request takes turns with schedule marks instead of waiting behind every task they queued.
 */
export function requestFlow(req: FastifyRequest): { owner: string; flow: string } {
  return { owner: req.keyId ?? '', flow: `request:${String(req.id)}` };
}
