// Every address of Kitwright's API the browser uses, spelled once: the hooks modules beside this file call
// them, and pages use them for links (exports, downloads). No React here, so server components may import it.
// data-layer.test.ts checks that each one names a route under app/api.
import type { AuditExportFormat } from "@/lib/api-types/audits";

const studio = (studioId: string) => `/api/studios/${studioId}`;
const library = (studioId: string, libraryId: string) => `${studio(studioId)}/libraries/${libraryId}`;
const query = (params: Record<string, string | undefined>) => {
  const q = new URLSearchParams(Object.entries(params).filter((e): e is [string, string] => e[1] !== undefined && e[1] !== ""));
  const text = q.toString();
  return text ? `?${text}` : "";
};

export const paths = {
  // account
  me: () => "/api/me",
  signUp: () => "/api/auth/signup",
  verification: () => "/api/auth/verification",
  passwordReset: () => "/api/auth/password-reset",
  passwordResetConfirm: () => "/api/auth/password-reset/confirm",
  // personal API tokens (the account page)
  apiTokens: () => "/api/me/tokens",
  apiToken: (tokenId: string) => `/api/me/tokens/${tokenId}`,
  // studios, members, invitations, activity
  studios: () => "/api/studios",
  studio: (studioId: string) => studio(studioId),
  activity: (studioId: string, before?: string) => `${studio(studioId)}/activity${query({ before })}`,
  members: (studioId: string) => `${studio(studioId)}/members`,
  member: (studioId: string, userId: string) => `${studio(studioId)}/members/${userId}`,
  invitations: (studioId: string) => `${studio(studioId)}/invitations`,
  invitation: (studioId: string, invitationId: string) => `${studio(studioId)}/invitations/${invitationId}`,
  acceptInvitation: () => "/api/invitations/accept",
  // libraries and what hangs off one
  libraries: (studioId: string) => `${studio(studioId)}/libraries`,
  library: (studioId: string, libraryId: string) => library(studioId, libraryId),
  libraryProgress: (studioId: string, libraryId: string) => `${library(studioId, libraryId)}/progress`,
  libraryHealth: (studioId: string, libraryId: string) => `${library(studioId, libraryId)}/health`,
  libraryPlots: (studioId: string, libraryId: string) => `${library(studioId, libraryId)}/plots`,
  velocityResponse: (studioId: string, libraryId: string) => `${library(studioId, libraryId)}/velocity-response`,
  uploads: (studioId: string, libraryId: string) => `${library(studioId, libraryId)}/uploads`,
  instruments: (studioId: string, libraryId: string) => `${library(studioId, libraryId)}/instruments`,
  instrument: (studioId: string, libraryId: string, instrumentId: string) => `${library(studioId, libraryId)}/instruments/${instrumentId}`,
  mergeInstruments: (studioId: string, libraryId: string) => `${library(studioId, libraryId)}/instruments/merge`,
  /** `search` is the browser's URL query (page, pageSize, sort, dir, q, family, articulation, state, instrument, flag). */
  samples: (studioId: string, libraryId: string, search: string) => `${library(studioId, libraryId)}/samples${search ? `?${search}` : ""}`,
  sample: (studioId: string, libraryId: string, sampleId: string) => `${library(studioId, libraryId)}/samples/${sampleId}`,
  sampleAudio: (studioId: string, libraryId: string, sampleId: string) => `${library(studioId, libraryId)}/samples/${sampleId}/audio`,
  relabelSamples: (studioId: string, libraryId: string) => `${library(studioId, libraryId)}/samples/relabel`,
  confirmSamples: (studioId: string, libraryId: string) => `${library(studioId, libraryId)}/samples/confirm`,
  // strokes
  strokes: (studioId: string) => `${studio(studioId)}/strokes`,
  strokesFile: (studioId: string) => `${studio(studioId)}/strokes?download=1`,
  stroke: (studioId: string, strokeId: string, moveTo?: string) => `${studio(studioId)}/strokes/${strokeId}${query({ moveTo })}`,
  strokeUses: (studioId: string, strokeId: string) => `${studio(studioId)}/strokes/${strokeId}/uses`,
  // kits
  kits: (studioId: string) => `${studio(studioId)}/kits`,
  kit: (studioId: string, kitId: string) => `${studio(studioId)}/kits/${kitId}`,
  kitCopy: (studioId: string, kitId: string) => `${studio(studioId)}/kits/${kitId}/copy`,
  kitExport: (studioId: string, kitId: string) => `${studio(studioId)}/kits/${kitId}/export`,
  kitImport: (studioId: string) => `${studio(studioId)}/kits/import`,
  kitInstruments: (studioId: string) => `${studio(studioId)}/kits/instruments`,
  // layouts
  layouts: (studioId: string) => `${studio(studioId)}/layouts`,
  layout: (studioId: string, layoutId: string) => `${studio(studioId)}/layouts/${layoutId}`,
  layoutCopy: (studioId: string, layoutId: string) => `${studio(studioId)}/layouts/${layoutId}/copy`,
  layoutExport: (studioId: string, layoutId: string) => `${studio(studioId)}/layouts/${layoutId}/export`,
  layoutImport: (studioId: string) => `${studio(studioId)}/layouts/import`,
  layoutSuggest: (studioId: string) => `${studio(studioId)}/layouts/suggest`,
  layoutShare: (studioId: string, layoutId: string) => `${studio(studioId)}/layouts/${layoutId}/share`,
  sharedImport: (studioId: string) => `${studio(studioId)}/shared-layouts/import`,
  /** A shared layout for anyone with the link (no account); add ?download=1 for the layout file. */
  sharedLayout: (token: string) => `/api/shared/${token}`,
  // audits
  audits: (studioId: string, layoutId?: string) => `${studio(studioId)}/audits${query({ layoutId })}`,
  audit: (studioId: string, auditId: string) => `${studio(studioId)}/audits/${auditId}`,
  auditCompare: (studioId: string, before: string, after: string) => `${studio(studioId)}/audits/compare${query({ before, after })}`,
  auditSounds: (studioId: string, auditId: string) => `${studio(studioId)}/audits/${auditId}/sounds`,
  auditExport: (studioId: string, auditId: string, format: AuditExportFormat) => `${studio(studioId)}/audits/${auditId}/export${query({ format })}`,
};
