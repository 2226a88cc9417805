import { BadRequestException, ForbiddenException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectConnection } from '@nestjs/sequelize';
import { randomUUID } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';
import type { ProjectAccess } from '../common/auth-user.js';
import { fieldError } from '../common/errors.js';
import { MailService } from '../mail/mail.service.js';
import { MapsService } from '../maps/maps.service.js';
import { SpotChecksService } from '../spot-checks/spot-checks.service.js';
import type { CommentDto, MapReviewState, MapReviewStateDto, RequestReviewDto, ReviewCommentDto, ReviewDto, VerdictDto } from './dto/review.dto.js';
import { reviewRequestMail } from './review-mail.js';

interface ReviewRow {
  id: string;
  mapPk: number;
  mapId: string;
  requestedBy: string | null;
  reviewerId: string | null;
  message: string;
  status: string;
  verdictNote: string | null;
  verdictAt: Date | null;
  mapIdentity: string | null;
  pointsDigest: string | null;
  pointCount: number | null;
  currentDigest: string;
  createdAt: Date;
}

const REVIEW_SELECT =
  'SELECT r.id, r.map_pk AS mapPk, m.id AS mapId, r.requested_by AS requestedBy, r.reviewer_id AS reviewerId, r.message, r.status, r.verdict_note AS verdictNote, ' +
  'r.verdict_at AS verdictAt, r.map_identity AS mapIdentity, r.points_digest AS pointsDigest, r.point_count AS pointCount, m.points_digest AS currentDigest, r.created_at AS createdAt ' +
  'FROM reviews r JOIN maps m ON m.pk = r.map_pk';

/**
 * The state of a map's latest review. Keep in step with mapReviewState in
 * pwa/src/features/reviews/lib/review-state.ts (which decides it from a map's full review list).
 */
export function reviewStateOf(status: string | null, outdated: boolean): MapReviewState {
  if (status === null) return 'none';
  if (status === 'requested') return 'requested';
  if (outdated) return 'outdated';
  return status === 'approved' ? 'approved' : 'changes-requested';
}

/** Review requests, comments and verdicts on maps. */
@Injectable()
export class ReviewsService {
  constructor(
    @InjectConnection() private readonly sequelize: Sequelize,
    private readonly maps: MapsService,
    private readonly mail: MailService,
    private readonly spotChecks: SpotChecksService,
  ) {}

  async request(access: ProjectAccess, me: { id: string; displayName: string }, mapId: string, body: RequestReviewDto): Promise<ReviewDto> {
    const map = await this.maps.find(access.projectId, mapId);
    const [reviewer] = await this.sequelize.query<{ email: string; role: string }>(
      'SELECT u.email, m.role FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.project_id = ? AND m.user_id = ?',
      { type: QueryTypes.SELECT, replacements: [access.projectId, body.reviewerId.toLowerCase()] },
    );
    if (!reviewer || (reviewer.role !== 'reviewer' && reviewer.role !== 'owner')) {
      throw fieldError('reviewerId', 'must be a member of this project with the reviewer or owner role');
    }
    const id = randomUUID();
    await this.sequelize.query('INSERT INTO reviews (id, project_id, map_pk, requested_by, reviewer_id, message) VALUES (?, ?, ?, ?, ?, ?)', {
      replacements: [id, access.projectId, map.pk, me.id, body.reviewerId.toLowerCase(), body.message ?? ''],
    });
    const [project] = await this.sequelize.query<{ name: string }>('SELECT name FROM projects WHERE id = ?', { type: QueryTypes.SELECT, replacements: [access.projectId] });
    const sweep = JSON.parse(map.sweep) as { name?: string };
    const mailSent = await this.mail.send(
      reviewer.email,
      reviewRequestMail({
        requesterName: me.displayName,
        projectName: project?.name ?? 'a project',
        mapName: sweep.name ?? map.id,
        pointCount: map.pointCount,
        message: body.message ?? '',
        link: this.mail.link(`/projects/${access.projectId}/maps/${map.id}/reviews/${id}`),
      }),
    );
    return { ...(await this.get(access.projectId, id)), mailSent };
  }

  async get(projectId: string, reviewId: string): Promise<ReviewDto> {
    const rows = await this.sequelize.query<ReviewRow>(`${REVIEW_SELECT} WHERE r.project_id = ? AND r.id = ?`, { type: QueryTypes.SELECT, replacements: [projectId, reviewId] });
    if (rows.length === 0) throw new NotFoundException({ message: 'No such review in this project', details: null });
    return this.toDto(projectId, rows[0]);
  }

  async listForMap(projectId: string, mapId: string): Promise<ReviewDto[]> {
    const map = await this.maps.find(projectId, mapId);
    const rows = await this.sequelize.query<ReviewRow>(`${REVIEW_SELECT} WHERE r.map_pk = ? ORDER BY r.created_at, r.id`, { type: QueryTypes.SELECT, replacements: [map.pk] });
    return Promise.all(rows.map((r) => this.toDto(projectId, r)));
  }

  /**
   * Every map of the project with the state of its latest review (by request time, then id), in one
   * query, so a project's home page needs one request instead of one per map.
   */
  async statesForProject(projectId: string): Promise<MapReviewStateDto[]> {
    const rows = await this.sequelize.query<{
      mapId: string;
      pointCount: number | string;
      currentDigest: string;
      reviewId: string | null;
      status: string | null;
      reviewedDigest: string | null;
      reviewerId: string | null;
      reviewerName: string | null;
      updatedAt: Date | null;
    }>(
      'SELECT m.id AS mapId, m.point_count AS pointCount, m.points_digest AS currentDigest, r.id AS reviewId, r.status, r.points_digest AS reviewedDigest, ' +
        'r.reviewer_id AS reviewerId, u.display_name AS reviewerName, r.updated_at AS updatedAt ' +
        'FROM maps m LEFT JOIN (SELECT x.*, ROW_NUMBER() OVER (PARTITION BY x.map_pk ORDER BY x.created_at DESC, x.id DESC) AS n FROM reviews x WHERE x.project_id = ?) r ' +
        'ON r.map_pk = m.pk AND r.n = 1 LEFT JOIN users u ON u.id = r.reviewer_id WHERE m.project_id = ? ORDER BY m.id',
      { type: QueryTypes.SELECT, replacements: [projectId, projectId] },
    );
    return rows.map((r) => ({
      mapId: r.mapId,
      state: reviewStateOf(r.status, r.status !== 'requested' && r.reviewedDigest !== r.currentDigest),
      reviewId: r.reviewId,
      reviewerId: r.reviewerId,
      reviewerName: r.reviewerName,
      updatedAt: r.updatedAt,
      pointCount: Number(r.pointCount),
    }));
  }

  async comment(access: ProjectAccess, userId: string, reviewId: string, body: CommentDto): Promise<ReviewDto> {
    const review = await this.get(access.projectId, reviewId);
    if (body.pointKey !== undefined) {
      const map = await this.maps.find(access.projectId, review.mapId);
      if (!(await this.maps.keys(map.pk)).includes(body.pointKey)) throw fieldError('pointKey', `the map has no point "${body.pointKey}"`);
    }
    await this.sequelize.query('INSERT INTO review_comments (id, review_id, author_id, point_key, body) VALUES (?, ?, ?, ?, ?)', {
      replacements: [randomUUID(), reviewId, userId, body.pointKey ?? null, body.body],
    });
    return this.get(access.projectId, reviewId);
  }

  /** The assigned reviewer's verdict, attached to the map identity and point-set digest of this moment. */
  async verdict(access: ProjectAccess, userId: string, reviewId: string, body: VerdictDto): Promise<ReviewDto> {
    const review = await this.get(access.projectId, reviewId);
    if (review.reviewerId !== userId) {
      throw new ForbiddenException({ message: 'Only the reviewer this review was requested from may give its verdict', details: { reviewerId: review.reviewerId } });
    }
    const [updated] = await this.sequelize.query(
      'UPDATE reviews r JOIN maps m ON m.pk = r.map_pk SET r.status = ?, r.verdict_note = ?, r.verdict_at = CURRENT_TIMESTAMP(3), r.map_identity = m.identity, r.points_digest = m.points_digest, r.point_count = m.point_count, r.updated_at = CURRENT_TIMESTAMP(3) WHERE r.id = ?',
      { replacements: [body.verdict, body.note, reviewId] },
    );
    if (!updated) throw new BadRequestException({ message: 'The verdict could not be stored', details: null });
    return this.get(access.projectId, reviewId);
  }

  private async toDto(projectId: string, r: ReviewRow): Promise<ReviewDto> {
    const comments = await this.sequelize.query<ReviewCommentDto>(
      'SELECT c.id, c.author_id AS authorId, u.display_name AS authorName, c.point_key AS pointKey, c.body, c.created_at AS createdAt FROM review_comments c LEFT JOIN users u ON u.id = c.author_id WHERE c.review_id = ? ORDER BY c.created_at, c.id',
      { type: QueryTypes.SELECT, replacements: [r.id] },
    );
    return {
      id: r.id,
      mapId: r.mapId,
      requestedBy: r.requestedBy,
      reviewerId: r.reviewerId,
      message: r.message,
      status: r.status,
      verdictNote: r.verdictNote,
      verdictAt: r.verdictAt,
      mapIdentity: r.mapIdentity,
      pointsDigest: r.pointsDigest,
      pointCount: r.pointCount === null ? null : Number(r.pointCount),
      outdated: r.status !== 'requested' && r.pointsDigest !== r.currentDigest, // as in statesForProject
      comments,
      spotChecks: await this.spotChecks.list(projectId, r.mapId, r.id),
      createdAt: r.createdAt,
    };
  }
}
