import { Controller, Get, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOkResponse, ApiOperation, ApiTags, ApiUnauthorizedResponse } from '@nestjs/swagger';
import { HttpErrorBody } from '../common/http-error.js';
import { SiteAdminOnly } from '../common/site-admin.guard.js';
import { MailMessageDto, MailQueryDto } from './dto/mail-message.dto.js';
import { MailService } from './mail.service.js';

@ApiTags('admin')
@ApiBearerAuth()
@ApiUnauthorizedResponse({ type: HttpErrorBody, description: 'No valid access token; `details.reason` says why' })
@Controller('admin/mail')
export class MailController {
  constructor(private readonly mail: MailService) {}

  @Get()
  @SiteAdminOnly()
  @ApiOperation({
    summary: 'Messages the fake SMTP server received (site admins)',
    description: 'Development and demo aid: with PW_SMTP_FAKE=1 the server keeps every message it sends, so invitation and reset links can be opened without a mail account.',
  })
  @ApiOkResponse({ type: [MailMessageDto] })
  list(@Query() query: MailQueryDto): Promise<MailMessageDto[]> {
    return this.mail.list({ to: query.to, limit: query.limit ?? 50 });
  }
}
