/**
 * Every compute route, in one list, for the app and the OpenAPI document.
 */
import { clocksRoute } from './clocks.js';
import { geodesicRoute } from './geodesic.js';
import { deflectionRoute, delayRoute, shadowRoute } from './light.js';
import { localRoute } from './local.js';
import { circularRoute, precessionRoute } from './orbits.js';
import { properTimeRoute } from './proper-time.js';
import type { ComputeRoute } from './route.js';
import { spacetimeRoute } from './spacetime.js';
import { tidalRoute } from './tidal.js';
import { transformRoute } from './transform.js';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export const COMPUTE_ROUTES: readonly ComputeRoute<any, any>[] = [
  spacetimeRoute,
  localRoute,
  clocksRoute,
  properTimeRoute,
  circularRoute,
  precessionRoute,
  deflectionRoute,
  delayRoute,
  shadowRoute,
  geodesicRoute,
  tidalRoute,
  transformRoute,
];
