import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';
import { Bike } from '../bikes/bike.entity';
import { Comparison } from '../comparisons/comparison.entity';
import { User } from '../users/user.entity';

/** One generated gain-report PDF. Immutable: regenerating makes a new version with a new object. */
export class Report extends ShopOwnedEntity {
  bike!: Bike;
  comparison!: Comparison;
  /** Shop-wide report number, e.g. "R-2026-0042"; shared by every version of one report. */
  number!: string;
  version = 1;
  pdfKey!: string;
  pdfSha256!: string;
  pdfSizeBytes!: number;
  technicianNote: string | null = null;
  /** The figures printed in the PDF, kept so the share page and checks need not re-render. */
  summary: Record<string, unknown> | null = null;
  createdBy: User | null = null;
}

export type DeliveryStatus = 'queued' | 'sent' | 'failed';

/** One attempt to e-mail a report. */
export class ReportDelivery extends ShopOwnedEntity {
  report!: Report;
  to!: string;
  subject!: string;
  message!: string;
  status!: DeliveryStatus;
  error: string | null = null;
  messageId: string | null = null;
  sentBy: User | null = null;
}

/** A token link to one report; only the token's hash is stored. */
export class ShareLink extends ShopOwnedEntity {
  report!: Report;
  tokenHash!: string;
  expiresAt!: Date;
  revokedAt: Date | null = null;
  viewCount = 0;
  lastViewedAt: Date | null = null;
  createdBy: User | null = null;
}

export const ReportSchema = new EntitySchema<Report, ShopOwnedEntity>({
  class: Report,
  extends: ShopOwnedSchema,
  tableName: 'report',
  indexes: [{ properties: ['shop', 'bike'] }],
  uniques: [{ properties: ['shop', 'number', 'version'] }],
  properties: {
    bike: { kind: 'm:1', entity: () => Bike, deleteRule: 'cascade' },
    comparison: { kind: 'm:1', entity: () => Comparison, deleteRule: 'cascade' },
    number: { type: 'string', length: 40 },
    version: { type: 'integer' },
    pdfKey: { type: 'string', length: 500 },
    pdfSha256: { type: 'string', length: 64 },
    pdfSizeBytes: { type: 'integer' },
    technicianNote: { type: 'text', nullable: true },
    summary: { type: 'json', nullable: true },
    createdBy: { kind: 'm:1', entity: () => User, nullable: true, deleteRule: 'set null' },
  },
});

export const ReportDeliverySchema = new EntitySchema<ReportDelivery, ShopOwnedEntity>({
  class: ReportDelivery,
  extends: ShopOwnedSchema,
  tableName: 'report_delivery',
  properties: {
    report: { kind: 'm:1', entity: () => Report, deleteRule: 'cascade' },
    to: { type: 'string', length: 320, fieldName: 'recipient' },
    subject: { type: 'string', length: 300 },
    message: { type: 'text' },
    status: { type: 'string', length: 16 },
    error: { type: 'text', nullable: true },
    messageId: { type: 'string', length: 300, nullable: true },
    sentBy: { kind: 'm:1', entity: () => User, nullable: true, deleteRule: 'set null' },
  },
});

export const ShareLinkSchema = new EntitySchema<ShareLink, ShopOwnedEntity>({
  class: ShareLink,
  extends: ShopOwnedSchema,
  tableName: 'share_link',
  properties: {
    report: { kind: 'm:1', entity: () => Report, deleteRule: 'cascade' },
    tokenHash: { type: 'string', length: 64, unique: true },
    expiresAt: { type: 'datetime', columnType: 'timestamptz' },
    revokedAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
    viewCount: { type: 'integer', default: 0 },
    lastViewedAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
    createdBy: { kind: 'm:1', entity: () => User, nullable: true, deleteRule: 'set null' },
  },
});
