import { Router } from 'express';
import helmet from 'helmet';
import swaggerUi from 'swagger-ui-express';
import { openapiDocument } from './openapi-document';

/** `/api/openapi.json` (the contract as JSON) and `/api/docs` (Swagger UI over it). */
export function docsRoutes(): Router {
  const router = Router();
  const doc = openapiDocument();
  router.get('/openapi.json', (_req, res) => {
    res.json(doc);
  });
  // Swagger UI's page uses an inline bootstrap script and inline styles.
  router.use(
    '/docs',
    helmet.contentSecurityPolicy({
      directives: {
        scriptSrc: ["'self'", "'unsafe-inline'"],
        styleSrc: ["'self'", "'unsafe-inline'"],
        imgSrc: ["'self'", 'data:'],
        upgradeInsecureRequests: null,
      },
    }),
    swaggerUi.serve,
    swaggerUi.setup(doc, {
      customSiteTitle: 'Tropline API',
      swaggerOptions: { url: undefined, validatorUrl: null, persistAuthorization: true },
    }),
  );
  return router;
}
