import type { UploadResult } from './run';

/** Where a file sent by a dyno's sync agent landed. */
export type DeviceLanding =
  | { kind: 'dyno'; bikeId: string; bikeLabel: string; sessionId: string; stageId: string | null }
  /** `itemId`: the inbox item; `duplicate`: the same file was already waiting there (nothing new kept). */
  | { kind: 'inbox'; itemId: string; duplicate: boolean; pulls: number };

/**
 * Answer of `POST /api/device/runs` (Authorization: Bearer <device token>): the usual upload
 * results, one per run made from the file (a log with several pulls makes several), and where
 * they landed — the dyno's current bike and session, or the shop's inbox.
 */
export interface DeviceUploadResponse {
  landing: DeviceLanding;
  results: UploadResult[];
}

/** The route the sync agent posts to; multipart, one file in the field `files`. */
export const DEVICE_UPLOAD_PATH = '/api/device/runs';
