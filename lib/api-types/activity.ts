// Answers of GET /api/studios/:id/activity (the studio's activity log). Types only.

export interface ActivityEntry {
  id: number;
  studioId: string;
  actorId: string | null;
  actorName: string | null;
  action: string;
  subjectType: string | null;
  subjectId: string | null;
  details: Record<string, unknown> | null;
  createdAt: string;
}

/** GET /api/studios/:id/activity?before&limit */
export interface ActivityPage {
  entries: ActivityEntry[];
}
