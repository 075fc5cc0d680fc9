import { Module } from '@nestjs/common';
import { BackupsController } from './backups.controller.js';

/** Backups of the whole database (pg_dump); `npm run backup` / `npm run restore` do the same offline. */
@Module({ controllers: [BackupsController] })
export class BackupsModule {}
