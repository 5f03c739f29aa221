/**
 * GET /v1/quantities — the quantity catalogue.
 */
import type { FastifyInstance } from 'fastify';
import { z } from 'zod';
import { CATALOGUE } from '../catalogue.js';
import { service, serviceStamp } from './responses.js';

export const quantitiesResponse = z
  .object({
    service: serviceStamp,
    quantities: z.array(
      z.object({
        name: z.string(),
        unit: z.string().meta({ description: 'SI unit of the value ("1" for dimensionless).' }),
        geometricUnit: z.string().nullable().meta({ description: 'Unit of the geometric value, null if dimensionless.' }),
        description: z.string(),
        endpoint: z.string(),
        sweepable: z.boolean(),
      }),
    ),
  })
  .meta({ id: 'QuantitiesResponse' });

export function quantitiesDocument(): z.infer<typeof quantitiesResponse> {
  return {
    service,
    quantities: CATALOGUE.map(({ name, unit, geometricUnit, description, endpoint, sweepable }) => ({
      name,
      unit,
      geometricUnit,
      description,
      endpoint,
      sweepable,
    })),
  };
}

export function registerQuantities(app: FastifyInstance): void {
  const doc = JSON.stringify(quantitiesDocument());
  app.get('/v1/quantities', async (_req, reply) => {
    reply.type('application/json').header('cache-control', 'public, max-age=3600');
    return doc;
  });
}
