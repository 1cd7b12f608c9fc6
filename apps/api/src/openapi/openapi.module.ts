import { Module } from '@nestjs/common';
import { OpenApiController } from './openapi.controller.js';

/** Development only; its Swagger UI assets are served by createApp under /api/docs/assets. */
@Module({ controllers: [OpenApiController] })
export class OpenApiModule {}
