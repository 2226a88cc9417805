import { Body, Controller, Get, HttpCode, HttpStatus, Param, ParseUUIDPipe, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiCreatedResponse, ApiOkResponse, ApiOperation, ApiTags, ApiUnauthorizedResponse } from '@nestjs/swagger';
import type { AuthUser, ProjectAccess } from '../common/auth-user.js';
import { CurrentAccess, CurrentUser } from '../common/decorators.js';
import { HttpErrorBody } from '../common/http-error.js';
import { ANY_MEMBER, ProjectRoles } from '../memberships/project-roles.guard.js';
import { CommentDto, MapReviewStateDto, RequestReviewDto, ReviewDto, VerdictDto } from './dto/review.dto.js';
import { ReviewsService } from './reviews.service.js';

@ApiTags('reviews')
@ApiBearerAuth()
@ApiUnauthorizedResponse({ type: HttpErrorBody, description: 'No valid access token' })
@Controller('projects/:projectId')
export class ReviewsController {
  constructor(private readonly reviews: ReviewsService) {}

  @Post('maps/:mapId/reviews')
  @ProjectRoles('owner', 'editor')
  @ApiOperation({ summary: 'Ask a project reviewer to review a map; they get an e-mail notice (editors, owners)' })
  @ApiCreatedResponse({ type: ReviewDto })
  request(@CurrentAccess() access: ProjectAccess, @CurrentUser() me: AuthUser, @Param('mapId') mapId: string, @Body() body: RequestReviewDto): Promise<ReviewDto> {
    return this.reviews.request(access, me, mapId, body);
  }

  @Get('maps/:mapId/reviews')
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'Reviews of a map with comments, spot-checks and whether each verdict is outdated (any member)' })
  @ApiOkResponse({ type: [ReviewDto] })
  list(@CurrentAccess() access: ProjectAccess, @Param('mapId') mapId: string): Promise<ReviewDto[]> {
    return this.reviews.listForMap(access.projectId, mapId);
  }

  @Get('reviews')
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: "Every map of the project with its latest review's state, reviewer, time and the map's current point count (any member)" })
  @ApiOkResponse({ type: [MapReviewStateDto] })
  states(@CurrentAccess() access: ProjectAccess): Promise<MapReviewStateDto[]> {
    return this.reviews.statesForProject(access.projectId);
  }

  @Get('reviews/:reviewId')
  @ProjectRoles(...ANY_MEMBER)
  @ApiOperation({ summary: 'One review (any member)' })
  @ApiOkResponse({ type: ReviewDto })
  get(@CurrentAccess() access: ProjectAccess, @Param('reviewId', ParseUUIDPipe) reviewId: string): Promise<ReviewDto> {
    return this.reviews.get(access.projectId, reviewId);
  }

  @Post('reviews/:reviewId/comments')
  @ProjectRoles('owner', 'editor', 'reviewer')
  @ApiOperation({ summary: 'Comment on the map or on one point (reviewers, editors, owners)' })
  @ApiCreatedResponse({ type: ReviewDto })
  comment(@CurrentAccess() access: ProjectAccess, @CurrentUser() me: AuthUser, @Param('reviewId', ParseUUIDPipe) reviewId: string, @Body() body: CommentDto): Promise<ReviewDto> {
    return this.reviews.comment(access, me.id, reviewId, body);
  }

  @Post('reviews/:reviewId/verdict')
  @HttpCode(HttpStatus.OK)
  @ProjectRoles('owner', 'reviewer')
  @ApiOperation({ summary: 'Approve or request changes, with a note (the requested reviewer only); attached to the map identity and point-set digest of now' })
  @ApiOkResponse({ type: ReviewDto })
  verdict(@CurrentAccess() access: ProjectAccess, @CurrentUser() me: AuthUser, @Param('reviewId', ParseUUIDPipe) reviewId: string, @Body() body: VerdictDto): Promise<ReviewDto> {
    return this.reviews.verdict(access, me.id, reviewId, body);
  }
}
