import { Controller, Get, Header } from '@nestjs/common';
import { Public } from '../common/public.decorator.js';
import { buildOpenApiDocument } from './openapi-document.js';

const swaggerPage = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>Torquetrail API</title>
<link rel="icon" href="data:,"><link rel="stylesheet" href="/api/docs/assets/swagger-ui.css"></head>
<body><div id="docs"></div><script src="/api/docs/assets/swagger-ui-bundle.js"></script>
<script src="/api/docs/assets/init.js"></script></body></html>`;

/** Development only (see AppModule): the API's OpenAPI document and a Swagger UI page for it. */
@Controller('docs')
export class OpenApiController {
  private readonly document = buildOpenApiDocument();

  @Public()
  @Get()
  @Header('content-type', 'text/html; charset=utf-8')
  page(): string {
    return swaggerPage;
  }

  @Public()
  @Get('openapi.json')
  json() {
    return this.document;
  }

  @Public()
  @Get('assets/init.js')
  @Header('content-type', 'text/javascript; charset=utf-8')
  init(): string {
    return "window.ui = SwaggerUIBundle({ url: '/api/docs/openapi.json', dom_id: '#docs' });";
  }
}
