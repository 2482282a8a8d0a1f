import { buildOpenApiDocument } from '@/lib/api/openapi';

/** GET /api/v1/openapi.json — public. */
export async function GET(request: Request): Promise<Response> {
  return Response.json(buildOpenApiDocument(new URL(request.url).origin), { headers: { 'cache-control': 'public, max-age=300' } });
}
