/**
 * Bay capture: device tokens (one dyno's sync agent, upload only), what is on a dyno now, the bay
 * board of a dyno, and the shop's inbox of files that arrived with nothing on the dyno.
 */
import { z } from 'zod';
import { uuid } from './common';
import type { RunSummaryDto, SessionDto, UploadResult } from './run';

export const deviceTokenInput = z.object({ name: z.string().trim().min(1, 'Name the token (e.g. "Bay 1 PC")').max(100) });

/** A device token as listed (the token itself is shown once, at creation). */
export interface DeviceTokenDto {
  id: string;
  dynoId: string;
  name: string;
  createdAt: string;
  createdByName: string | null;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

/** 201 answer of POST /api/dynos/:id/device-tokens: the only time the token is shown. */
export interface DeviceTokenCreatedDto {
  id: string;
  token: string;
}

const blankToUndefined = (v: unknown) => (v === '' || v === null ? undefined : v);

/** PUT /api/dynos/:id/current: the bike strapped to the dyno, optionally its session and stage. */
export const dynoCurrentInput = z.object({
  bikeId: uuid,
  sessionId: z.preprocess(blankToUndefined, uuid.optional()),
  stageId: z.preprocess(blankToUndefined, uuid.optional()),
});

/** What is on a dyno now (the answer of PUT /api/dynos/:id/current). */
export interface DynoCurrentDto {
  bikeId: string;
  sessionId: string;
  stageId: string | null;
}

/** One pull on the bay board, corrected with its stored factor, against the board's reference. */
export interface BayPullDto {
  run: RunSummaryDto;
  /** Corrected curve (stored factor), null while the run is not readable. */
  curve: { rpm: number[]; powerHp: number[]; torqueLbft: number[] } | null;
  peakPowerHp: number | null;
  peakTorqueLbft: number | null;
  /** Against the reference run; null without one, for the reference itself, or without a common rpm range. */
  gain: { peakPowerHp: number; peakTorqueLbft: number; averagePowerHp: number } | null;
}

/** GET /api/dynos/:id/board: everything the wall tablet shows. */
export interface BayBoardDto {
  dyno: { id: string; name: string; kind: string };
  agentLastHeardAt: string | null;
  /** Device tokens not revoked: none means no agent can send files. */
  activeTokens: number;
  current: {
    bikeId: string;
    bikeLabel: string;
    customerName: string;
    session: SessionDto & { conditionsToConfirm: boolean };
    stage: { id: string; name: string } | null;
    setAt: string | null;
  } | null;
  /** The run each pull is drawn against: the stage's reference run, else the bike's baseline. */
  reference: { kind: 'stage-reference' | 'baseline'; label: string; pull: BayPullDto } | null;
  /** The session's pulls, oldest first. */
  pulls: BayPullDto[];
  /** Spread of this stage's pulls in this session ("3 pulls within 0.8 hp"); null with fewer than 2. */
  spread: { stageName: string | null; pulls: number; peakPowerSpreadHp: number; text: string } | null;
}

/** A file that arrived from a dyno with nothing on it, waiting to be assigned. */
export interface InboxItemDto {
  id: string;
  originalName: string;
  sizeBytes: number;
  sha256: string;
  dynoId: string | null;
  dynoName: string | null;
  receivedAt: string;
  /** What a first reading found (before any bike is known). */
  summary: { pulls: number; readable: number; peaks: { hp: number | null; rpm: number | null; lbft: number | null }[]; error: string | null };
  /** Times the same file arrived again while waiting. */
  repeats: number;
}

export const inboxAssignInput = dynoCurrentInput;

/** POST /api/runs/inbox/:id/assign: the usual upload results for the file's runs. */
export interface InboxAssignResponse {
  results: UploadResult[];
}
