export { buildOpenApiDocument, type OpenApiDocument } from './document';
export { API_OPERATIONS } from './operations';
export type { ApiOperation } from './types';
