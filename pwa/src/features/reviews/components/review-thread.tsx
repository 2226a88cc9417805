import { useState } from 'react';
import { Badge } from '../../../components/ui/badge.js';
import { Button } from '../../../components/ui/button.js';
import { Card } from '../../../components/ui/card.js';
import { errorText } from '../../../lib/api-client.js';
import { useMembers } from '../../projects/api/get-members.js';
import { useAddComment } from '../api/add-comment.js';
import type { ReviewDto } from '../api/get-reviews.js';
import { useGiveVerdict } from '../api/give-verdict.js';
import { useRequestReview } from '../api/request-review.js';

const input = 'w-full rounded border border-line px-2 py-1 text-sm';

const statusTone = { requested: 'neutral', approved: 'good', 'changes-requested': 'warn' } as const;
const statusText = { requested: 'review requested', approved: 'approved', 'changes-requested': 'changes requested' } as const;

/** Editors and owners ask a project reviewer (or owner) to review the map; the server e-mails them. */
export function RequestReviewForm({ projectId, mapId }: { projectId: string; mapId: string }) {
  const members = useMembers(projectId);
  const request = useRequestReview(projectId, mapId);
  const [reviewerId, setReviewerId] = useState('');
  const [message, setMessage] = useState('');
  const candidates = (members.data ?? []).filter((m) => m.role === 'reviewer' || m.role === 'owner');
  return (
    <Card title="Request a review" data={{ testid: 'request-review' }}>
      <form
        className="space-y-2"
        onSubmit={(e) => {
          e.preventDefault();
          if (reviewerId) request.mutate({ reviewerId, ...(message.trim() ? { message: message.trim() } : {}) });
        }}
      >
        <label className="block text-sm">
          Reviewer
          <select className={input} value={reviewerId} onChange={(e) => setReviewerId(e.target.value)} data-testid="review-reviewer">
            <option value="">Pick a project reviewer…</option>
            {candidates.map((m) => (
              <option key={m.userId} value={m.userId}>
                {m.displayName} ({m.email}, {m.role})
              </option>
            ))}
          </select>
        </label>
        <label className="block text-sm">
          What to look at
          <textarea className={input} rows={2} value={message} onChange={(e) => setMessage(e.target.value)} data-testid="review-message" />
        </label>
        {members.error ? <p className="text-sm text-red-800">{errorText(members.error)}</p> : null}
        {request.error ? <p className="text-sm text-red-800" role="alert">{errorText(request.error)}</p> : null}
        {request.data ? <p className="text-sm text-ink-700" role="status">Review requested{request.data.mailSent ? '; the reviewer was e-mailed' : ''}.</p> : null}
        <Button type="submit" disabled={!reviewerId || request.isPending} data-testid="review-request-submit">
          Request review
        </Button>
      </form>
    </Card>
  );
}

/** One review: status, outdated flag, comments (on the map or a point), and the verdict form for its reviewer. */
export function ReviewThread({ projectId, review, myUserId, canComment, pointKeys, names }: { projectId: string; review: ReviewDto; myUserId: string | undefined; canComment: boolean; pointKeys: string[]; names: Record<string, string> }) {
  const comment = useAddComment(projectId, review.mapId, review.id);
  const verdict = useGiveVerdict(projectId, review.mapId, review.id);
  const [body, setBody] = useState('');
  const [pointKey, setPointKey] = useState('');
  const [note, setNote] = useState('');
  const [choice, setChoice] = useState<'approved' | 'changes-requested'>('approved');
  const isReviewer = !!myUserId && review.reviewerId === myUserId;
  return (
    <Card
      title={`Review by ${names[review.reviewerId ?? ''] ?? 'a reviewer'}, requested by ${names[review.requestedBy ?? ''] ?? 'a member'}`}
      aside={
        <span className="flex gap-2">
          <Badge tone={statusTone[review.status]}>{statusText[review.status]}</Badge>
          {review.outdated ? <Badge tone="warn">outdated</Badge> : null}
        </span>
      }
      data={{ testid: 'review', status: review.status, outdated: String(review.outdated) }}
    >
      <div className="space-y-3 text-sm text-ink-800">
        {review.message ? <p className="italic">“{review.message}”</p> : null}
        {review.status !== 'requested' ? (
          <p data-testid="review-verdict">
            Verdict: <b>{statusText[review.status]}</b>
            {review.verdictAt ? ` on ${new Date(review.verdictAt).toLocaleString()}` : ''}
            {review.pointCount !== null ? ` (covering ${review.pointCount} points)` : ''} — {review.verdictNote}
          </p>
        ) : null}
        {review.outdated ? (
          <p className="text-amber-900" data-testid="review-outdated-note">
            The map gained or changed points after the verdict: it covers the {review.pointCount ?? ''} points of that moment, not all of the map now.
          </p>
        ) : null}
        <div>
          <h3 className="font-semibold">Comments</h3>
          {review.comments.length === 0 ? <p className="text-ink-600">None yet.</p> : null}
          <ul className="space-y-1" data-testid="review-comments">
            {review.comments.map((c) => (
              <li key={c.id}>
                <b>{c.authorName ?? 'former member'}</b> {c.pointKey ? <span className="font-mono text-xs">on {c.pointKey}</span> : <span className="text-xs">on the map</span>}: {c.body}
              </li>
            ))}
          </ul>
        </div>
        {canComment ? (
          <form
            className="space-y-2"
            onSubmit={(e) => {
              e.preventDefault();
              if (body.trim()) comment.mutate({ body: body.trim(), ...(pointKey ? { pointKey } : {}) }, { onSuccess: () => setBody('') });
            }}
          >
            <textarea className={input} rows={2} value={body} onChange={(e) => setBody(e.target.value)} placeholder="A comment" data-testid="comment-body" />
            <div className="flex flex-wrap items-center gap-2">
              <select className="rounded border border-line px-2 py-1" value={pointKey} onChange={(e) => setPointKey(e.target.value)} data-testid="comment-point">
                <option value="">on the whole map</option>
                {pointKeys.map((k) => (
                  <option key={k} value={k}>
                    on point {k}
                  </option>
                ))}
              </select>
              <Button type="submit" variant="secondary" disabled={!body.trim() || comment.isPending} data-testid="comment-submit">
                Comment
              </Button>
            </div>
            {comment.error ? <p className="text-red-800" role="alert">{errorText(comment.error)}</p> : null}
          </form>
        ) : null}
        {isReviewer ? (
          <form
            className="space-y-2 rounded-lg border border-line p-3"
            onSubmit={(e) => {
              e.preventDefault();
              if (note.trim()) verdict.mutate({ verdict: choice, note: note.trim() });
            }}
            data-testid="verdict-form"
          >
            <h3 className="font-semibold">Your verdict</h3>
            <div className="flex gap-4">
              <label>
                <input type="radio" name={`verdict-${review.id}`} checked={choice === 'approved'} onChange={() => setChoice('approved')} data-testid="verdict-approved" /> Approve
              </label>
              <label>
                <input type="radio" name={`verdict-${review.id}`} checked={choice === 'changes-requested'} onChange={() => setChoice('changes-requested')} data-testid="verdict-changes" /> Request changes
              </label>
            </div>
            <textarea className={input} rows={2} value={note} onChange={(e) => setNote(e.target.value)} placeholder="A note (required)" data-testid="verdict-note" />
            {verdict.error ? <p className="text-red-800" role="alert">{errorText(verdict.error)}</p> : null}
            <Button type="submit" disabled={!note.trim() || verdict.isPending} data-testid="verdict-submit">
              Give verdict
            </Button>
          </form>
        ) : null}
      </div>
    </Card>
  );
}
