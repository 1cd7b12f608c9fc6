import { Module } from '@nestjs/common';
import { AuthModule } from '../auth/auth.module.js';
import { AccountMailService } from './account-mail.service.js';
import { AccountController } from './account.controller.js';
import { AccountService } from './account.service.js';
import { PeopleController } from './people.controller.js';
import { PeopleService } from './people.service.js';

/** People and sign-in: users, invitations, password resets and the practice's session settings. */
@Module({
  imports: [AuthModule],
  controllers: [PeopleController, AccountController],
  providers: [PeopleService, AccountService, AccountMailService],
  // Shares invite a referring surgeon new to Torquetrail with the same one-time link mail.
  exports: [AccountMailService],
})
export class PeopleModule {}
