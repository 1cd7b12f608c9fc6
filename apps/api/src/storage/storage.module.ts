import { Global, Module } from '@nestjs/common';
import { StorageService } from './storage.service.js';
import { StreamSlots } from './stream-slots.js';

@Global()
@Module({ providers: [StorageService, StreamSlots], exports: [StorageService, StreamSlots] })
export class StorageModule {}
