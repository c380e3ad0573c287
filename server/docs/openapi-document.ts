import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parse } from 'yaml';
import type { OpenAPIV3_1 } from 'openapi-types';

/** Path of the published contract. */
export const OPENAPI_FILE = fileURLToPath(new URL('../../openapi/openapi.yaml', import.meta.url));

let cached: OpenAPIV3_1.Document | undefined;

/** The OpenAPI 3.1 document, parsed once from `openapi/openapi.yaml`. */
export function openapiDocument(): OpenAPIV3_1.Document {
  cached ??= parse(readFileSync(OPENAPI_FILE, 'utf8')) as OpenAPIV3_1.Document;
  return cached;
}
