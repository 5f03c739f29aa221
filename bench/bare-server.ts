/**
 * The rivals the service is measured against: a bare fastify 5 app with one JSON route and nothing
 * else (no logger, no hooks, no validation). bench/run.ts starts it as a child process:
 *
 *   node --import tsx bench/bare-server.ts <port> tiny                       GET /         -> {"hello":"world"}
 *   node --import tsx bench/bare-server.ts <port> payload <file.json>        GET /v1/local -> the bytes of <file.json>
 *   node --import tsx bench/bare-server.ts <port> payload-post <file.json>   POST /v1/local (JSON body) -> the same
 *
 * The payload variants send the bytes of a real /v1/local response, read once at start, as a
 * pre-serialised JSON string: each request pays only fastify's routing, query or JSON body parsing and
 * the write of the same bytes the service sends, so the difference to the service is all the
 * service's own work (headers, hooks, cache lookup or computation). Each variant is its own process.
 */
import { readFileSync } from 'node:fs';
import Fastify, { type FastifyReply } from 'fastify';

const [portText, variant, payloadFile] = process.argv.slice(2);
const port = Number(portText);
if (!Number.isInteger(port) || port <= 0 || port > 65_535) throw new Error(`bad port "${portText}"`);

const app = Fastify({ logger: false });
if (variant === 'tiny') {
  app.get('/', async () => ({ hello: 'world' }));
} else if ((variant === 'payload' || variant === 'payload-post') && payloadFile) {
  const document = readFileSync(payloadFile, 'utf8');
  const send = (_request: unknown, reply: FastifyReply) => {
    reply.type('application/json; charset=utf-8').send(document);
  };
  if (variant === 'payload') app.get('/v1/local', send);
  // fastify's default content-type parser reads and JSON-parses the body before the handler runs.
  else app.post('/v1/local', send);
} else {
  throw new Error('usage: bare-server.ts <port> tiny | payload <file.json> | payload-post <file.json>');
}

const close = () => {
  app.close().then(
    () => process.exit(0),
    () => process.exit(1),
  );
};
process.on('SIGTERM', close);
process.on('SIGINT', close);

await app.listen({ port, host: '127.0.0.1' });
