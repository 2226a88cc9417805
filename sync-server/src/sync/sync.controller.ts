import { Body, Controller, Get, Headers, HttpCode, HttpStatus, Post, Query, Res } from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiBearerAuth,
  ApiBody,
  ApiConflictResponse,
  ApiOkResponse,
  ApiOperation,
  ApiPayloadTooLargeResponse,
  ApiTags,
  ApiUnauthorizedResponse,
} from '@nestjs/swagger';
import type { Response } from 'express';
import type { AuthUser, ProjectAccess } from '../common/auth-user.js';
import { CurrentAccess, CurrentUser } from '../common/decorators.js';
import { HttpErrorBody } from '../common/http-error.js';
import { ANY_MEMBER, ProjectRoles } from '../memberships/project-roles.guard.js';
import { PullQueryDto } from './dto/pull-query.dto.js';
import { PullResponse, PushDto, PushResponse } from './dto/sync.dto.js';
import { SyncService } from './sync.service.js';

const DEFAULT_PAGE = 2000;

@ApiTags('sync')
@ApiBearerAuth()
@ApiUnauthorizedResponse({ type: HttpErrorBody, description: 'No valid access token' })
@Controller('projects/:projectId/sync')
export class SyncController {
  constructor(private readonly sync: SyncService) {}

  @Post('push')
  @HttpCode(HttpStatus.OK)
  @ProjectRoles('owner', 'editor')
  @ApiOperation({
    summary: 'Push a batch of changes (editors, owners): all or nothing; a replayed batchId returns the first response and changes nothing (header Idempotent-Replay: true)',
  })
  @ApiBody({ type: PushDto })
  @ApiOkResponse({ type: PushResponse })
  @ApiBadRequestResponse({ type: HttpErrorBody, description: 'Malformed batch or map; `details` lists each problem with its JSON path' })
  @ApiConflictResponse({ type: HttpErrorBody, description: 'Stale edits: `details.conflicts` holds your version and the server’s for each' })
  @ApiPayloadTooLargeResponse({ type: HttpErrorBody, description: 'Too many points, changes or bytes in one batch' })
  async push(
    @CurrentAccess() access: ProjectAccess,
    @CurrentUser() me: AuthUser,
    @Body() body: unknown,
    @Headers('content-length') length: string | undefined,
    @Res({ passthrough: true }) res: Response,
  ): Promise<PushResponse> {
    const bytes = length !== undefined && /^\d+$/.test(length) ? Number(length) : undefined;
    const { response, replayed } = await this.sync.push(access, me.id, body, bytes);
    if (replayed) res.setHeader('Idempotent-Replay', 'true');
    return response;
  }

  @Get('pull')
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'Changes after a cursor, oldest first, in pages (any member); each record, map and point appears in its latest state. `limit` counts records, maps and points; points come in whole blocks (up to 250), so a page of one block may exceed it' })
  @ApiOkResponse({ type: PullResponse })
  async pull(@CurrentAccess() access: ProjectAccess, @Query() query: PullQueryDto, @Res({ passthrough: true }) res: Response): Promise<string> {
    // The service writes the PullResponse JSON itself (stored point texts spliced in).
    const text = await this.sync.pull(access.projectId, query.after ?? 0, query.limit ?? DEFAULT_PAGE);
    res.type('application/json');
    return text;
  }
}
