/**
 * Writes openapi/openapi.json from the code (npm run openapi). The file is committed; a test fails
 * when it differs from what the code generates.
 */
import { writeFileSync } from 'node:fs';
import { openApiPath, renderOpenApi } from '../src/api/openapi-file.js';

writeFileSync(openApiPath(), renderOpenApi());
console.log(`wrote ${openApiPath()}`);
