import { OpenAPIRegistry, OpenApiGeneratorV31 } from '@asteasolutions/zod-to-openapi';

/** Collects every route's zod schemas so the published document is generated, never hand-written. */
export function createOpenApiRegistry(): OpenAPIRegistry {
  const registry = new OpenAPIRegistry();
  registry.registerComponent('securitySchemes', 'bearer', { type: 'http', scheme: 'bearer', bearerFormat: 'JWT' });
  return registry;
}

export function generateOpenApiDocument(registry: OpenAPIRegistry) {
  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Cardloop API',
      version: '1',
      description: 'Demand explosion, kanban loops, supplier releases, receiving and line risk.',
    },
    servers: [{ url: '/api' }],
  });
}
