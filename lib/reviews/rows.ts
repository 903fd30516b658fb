// Review rows and the JSON the API and pages show for them (camelCase, ISO UTC times).
import { ASPECTS, type ReviewSide } from './schema';

export interface ReviewRow {
  id: string;
  job_id: string;
  author_side: ReviewSide;
  author_id: string | null;
  subject_shop_id: string | null;
  subject_rider_id: string | null;
  overall: number;
  build_quality: number | null;
  communication: number;
  on_time: number | null;
  clear_spec: number | null;
  payment: number | null;
  body: string;
  editable_until: Date;
  hidden_until: Date;
  created_at: Date;
  updated_at: Date;
}

export interface ReviewAspectView {
  key: string;
  label: string;
  stars: number;
}

export interface ReviewView {
  id: string;
  jobId: string;
  side: ReviewSide;
  /** How the author is shown: a rider's first name, or the shop's name. */
  authorLabel: string;
  overall: number;
  aspects: ReviewAspectView[];
  text: string;
  createdAt: string;
  updatedAt: string;
  editableUntil: string;
  /** The other side can read it from this moment (the earlier of both written and the period's end). */
  openFrom: string;
  /** The viewer may still change it. */
  canEdit: boolean;
}

const COLUMN_OF: Record<string, keyof ReviewRow> = {
  buildQuality: 'build_quality',
  communication: 'communication',
  onTime: 'on_time',
  clearSpec: 'clear_spec',
  payment: 'payment',
};

/** camelCase aspect key → column. */
export const aspectColumn = (key: string): keyof ReviewRow => COLUMN_OF[key];

/** The first word of a name: riders are shown by first name only. */
export const firstName = (name: string | null | undefined): string => (name ?? '').trim().split(/\s+/)[0] || 'A rider';

export function toReviewView(row: ReviewRow, authorLabel: string, canEdit: boolean): ReviewView {
  return {
    id: row.id,
    jobId: row.job_id,
    side: row.author_side,
    authorLabel,
    overall: row.overall,
    aspects: ASPECTS[row.author_side].map((a) => ({ key: a.key, label: a.label, stars: row[COLUMN_OF[a.key]] as number })),
    text: row.body,
    createdAt: row.created_at.toISOString(),
    updatedAt: row.updated_at.toISOString(),
    editableUntil: row.editable_until.toISOString(),
    openFrom: row.hidden_until.toISOString(),
    canEdit,
  };
}

/** Edits are allowed inside the edit window and only while the other side cannot read the review yet. */
export function isEditable(row: Pick<ReviewRow, 'editable_until' | 'hidden_until'>, now: Date): boolean {
  return now.getTime() < row.editable_until.getTime() && now.getTime() < row.hidden_until.getTime();
}

export const isOpenToView = (row: Pick<ReviewRow, 'hidden_until'>, now: Date): boolean => row.hidden_until.getTime() <= now.getTime();
