import { OpenAPIRegistry, OpenApiGeneratorV31 } from '@asteasolutions/zod-to-openapi';
import { ProblemBody } from '../../../shared/contracts/common';
import type { AnyRoute } from './route';

const API_PREFIX = '/api/v1';

function accessText(r: AnyRoute): string {
  if (r.access === 'public') return 'Anyone (no sign-in).';
  if (r.access === 'signed-in') return 'Any signed-in user.';
  return `Signed-in users with the role ${r.access.join(' or ')}.`;
}

/** The OpenAPI 3.1 document, generated from the same route table that serves the API. */
export function buildOpenApi(routes: readonly AnyRoute[], version: string): object {
  const registry = new OpenAPIRegistry();
  registry.registerComponent('securitySchemes', 'session', {
    type: 'apiKey',
    in: 'cookie',
    name: 'ringlet.sid',
  });
  registry.registerComponent('securitySchemes', 'csrf', {
    type: 'apiKey',
    in: 'header',
    name: 'x-csrf-token',
  });
  const problem = {
    description: 'Problem',
    content: { 'application/json': { schema: ProblemBody } },
  };
  for (const r of routes) {
    const status = r.status ?? 200;
    const ok = r.produces
      ? {
          description: 'The file',
          content: { [r.produces]: { schema: { type: 'string' as const, format: 'binary' } } },
        }
      : r.response && status !== 204
        ? { description: 'Success', content: { 'application/json': { schema: r.response } } }
        : { description: 'Success, no body' };
    const responses: Record<number, object> = { [status]: ok, 400: problem };
    if (r.access !== 'public') responses[401] = problem;
    if (Array.isArray(r.access)) responses[403] = problem;
    if (r.params) responses[404] = problem;
    if (r.method !== 'get' && !r.csrfExempt) responses[403] = problem;
    registry.registerPath({
      method: r.method,
      path: API_PREFIX + r.path,
      tags: [r.tag],
      summary: r.summary,
      description: [r.description, `Access: ${accessText(r)}`, r.availability]
        .filter(Boolean)
        .join('\n\n'),
      security: r.access === 'public' ? [] : [{ session: [] }],
      request: {
        ...(r.params ? { params: r.params as never } : {}),
        ...(r.query ? { query: r.query as never } : {}),
        ...(r.body ? { body: { content: { 'application/json': { schema: r.body } } } } : {}),
      },
      responses: responses as never,
    });
  }
  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Ringlet API',
      version,
      description:
        'Proficiency testing and precision studies for particle-sizing laboratories. Errors use the body `{ "error": { "code", "message", "details" } }`. State-changing requests need the session cookie and the `x-csrf-token` header (GET /api/v1/auth/csrf-token).',
    },
    servers: [{ url: '/' }],
  });
}
