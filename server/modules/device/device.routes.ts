import { ApiRouter, reply, type Reply } from '../../http/api-router';
import type { AppDeps } from '../../app-deps';
import { STAFF } from '@shared/roles';
import { idParams, type Page } from '@shared/schemas/common';
import { DEVICE_UPLOAD_PATH, type DeviceUploadResponse } from '@shared/schemas/device';
import { inboxAssignInput, type InboxAssignResponse, type InboxItemDto } from '@shared/schemas/bay';
import { AppError } from '../../lib/errors';
import { removeUploadedFiles, runFilesUpload, uploadedFiles } from '../../middleware/upload';
import { deviceCallerOf } from './device-auth';
import { deviceUpload } from './device-upload';
import { assignInboxItem, listInbox } from './inbox';

/**
 * The sync agent's upload (device token only) and the shop's inbox. Mounted before the runs
 * router so `/api/runs/inbox` is not read as a run id.
 */
export function deviceRoutes(deps: AppDeps): ApiRouter[] {
  const device = new ApiRouter('/api/device', deps);
  device.route({
    method: 'post',
    path: DEVICE_UPLOAD_PATH.replace('/api/device', ''),
    access: 'device',
    summary: 'A dyno’s sync agent sends a run file (multipart field "files"; Bearer device token)',
    before: [runFilesUpload(deps.config)],
    status: 201,
    handler: async ({ em, req, deps: d }): Promise<DeviceUploadResponse | Reply<DeviceUploadResponse>> => {
      try {
        const caller = req.res ? deviceCallerOf(req.res) : null;
        if (!caller) throw new AppError('DEVICE_TOKEN_REFUSED', 'A device token is required', 401);
        const files = uploadedFiles(req).map((f) => ({ originalName: f.originalname, contentType: f.mimetype || null, path: f.path }));
        // A heartbeat (no file): the gate has already recorded that the agent was heard.
        if (!files.length && req.get('x-pullbook-heartbeat')) return reply(undefined as unknown as DeviceUploadResponse, { status: 204 });
        return await deviceUpload(em, d, caller, files);
      } finally {
        await removeUploadedFiles(req);
      }
    },
  });

  const inbox = new ApiRouter('/api/runs/inbox', deps);
  inbox.route({ method: 'get', path: '/', access: STAFF, summary: 'Run files waiting for a bike (the inbox)', handler: ({ em, actor }): Promise<Page<InboxItemDto>> => listInbox(em, actor) });
  inbox.route({ method: 'post', path: '/:id/assign', access: STAFF, summary: 'Assign an inbox file to a bike, session and stage', params: idParams, body: inboxAssignInput, handler: ({ em, actor, params, body, deps: d }): Promise<InboxAssignResponse> => assignInboxItem(em, d, actor, params.id, body) });
  return [device, inbox];
}
