/**
 * The rival the service is measured against: a bare fastify 5 app with one JSON route and nothing
 * else (no logger, no hooks, no validation). bench/run.ts starts it as a child process:
 *
 *   node --import tsx bench/bare-server.ts <port> tiny                       GET /         -> {"hello":"world"}
 *   node --import tsx bench/bare-server.ts <port> payload <file.json>        GET /v1/local -> the document in <file.json>
 *   node --import tsx bench/bare-server.ts <port> payload-post <file.json>   POST /v1/local (JSON body) -> the same
 *
 * The payload variants return a copy of a real /v1/local response, parsed once at start: each request
 * pays only fastify's routing, query or JSON body parsing and JSON serialisation of the same document
 * the service sends, so the difference to the service is the service's own work. Each variant is its
 * own process with its one route.
 */
import { readFileSync } from 'node:fs';
import Fastify from 'fastify';

const [portText, variant, payloadFile] = process.argv.slice(2);
const port = Number(portText);
if (!Number.isInteger(port) || port <= 0 || port > 65_535) throw new Error(`bad port "${portText}"`);

const app = Fastify({ logger: false });
if (variant === 'tiny') {
  app.get('/', async () => ({ hello: 'world' }));
} else if ((variant === 'payload' || variant === 'payload-post') && payloadFile) {
  const document = JSON.parse(readFileSync(payloadFile, 'utf8')) as unknown;
  if (variant === 'payload') app.get('/v1/local', async () => document);
  // fastify's default content-type parser reads and JSON-parses the body before the handler runs.
  else app.post('/v1/local', async () => document);
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
