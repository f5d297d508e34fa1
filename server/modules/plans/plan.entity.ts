import { EntitySchema } from '@mikro-orm/core';
import { ShopOwnedEntity, ShopOwnedSchema } from '../../db/base-entity';
import type { PlanItemDto, PlanPredictionDto, PlanStatus } from '@shared/schemas/plans';
import { Bike } from '../bikes/bike.entity';
import { Stage } from '../stages/stage.entity';
import { User } from '../users/user.entity';

/**
 * A priced offer for a bike's next stage. Editable while `draft`; each send freezes the offer as
 * a PlanVersion (what the customer saw and accepted). Money in integer cents, in `currency`.
 */
export class Plan extends ShopOwnedEntity {
  bike!: Bike;
  title!: string;
  note: string | null = null;
  status: PlanStatus = 'draft';
  version = 0;
  items: PlanItemDto[] = [];
  totalCostCents = 0;
  currency = 'usd';
  prediction!: PlanPredictionDto;
  sentAt: Date | null = null;
  validUntil: Date | null = null;
  /** SHA-256 of the plan link's token (the token itself is only in the e-mail). */
  linkTokenHash: string | null = null;
  acceptedAt: Date | null = null;
  acceptedName: string | null = null;
  acceptedIp: string | null = null;
  acceptedVersion: number | null = null;
  declinedAt: Date | null = null;
  declineReason: string | null = null;
  depositCents = 0;
  depositPaidCents = 0;
  depositRefundedCents = 0;
  checkoutSessionId: string | null = null;
  paymentIntentId: string | null = null;
  convertedStage: Stage | null = null;
  createdBy: User | null = null;
  updatedAt: Date = new Date();
}

/** The plan as sent: one row per send, never changed afterwards. */
export class PlanVersion extends ShopOwnedEntity {
  plan!: Plan;
  version!: number;
  sentTo!: string;
  title!: string;
  items!: PlanItemDto[];
  totalCostCents!: number;
  depositCents!: number;
  currency!: string;
  prediction!: PlanPredictionDto;
  /** Object-storage key of the PDF quote sent with this version. */
  pdfKey!: string;
}

/** Provider events already handled, by their id: a replayed or duplicated event is ignored. */
export class PaymentEvent {
  eventId!: string;
  type!: string;
  plan: Plan | null = null;
  outcome!: string;
  receivedAt: Date = new Date();
}

export const PlanSchema = new EntitySchema<Plan, ShopOwnedEntity>({
  class: Plan,
  extends: ShopOwnedSchema,
  tableName: 'plan',
  indexes: [{ properties: ['shop', 'bike'] }],
  properties: {
    bike: { kind: 'm:1', entity: () => Bike, deleteRule: 'cascade' },
    title: { type: 'string', length: 200 },
    note: { type: 'text', nullable: true },
    status: { type: 'string', length: 16, default: 'draft' },
    version: { type: 'integer', default: 0 },
    items: { type: 'json' },
    totalCostCents: { type: 'integer', default: 0 },
    currency: { type: 'string', length: 3, default: 'usd' },
    prediction: { type: 'json' },
    sentAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
    validUntil: { type: 'datetime', columnType: 'timestamptz', nullable: true },
    linkTokenHash: { type: 'string', length: 64, nullable: true, unique: true },
    acceptedAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
    acceptedName: { type: 'string', length: 200, nullable: true },
    acceptedIp: { type: 'string', length: 64, nullable: true },
    acceptedVersion: { type: 'integer', nullable: true },
    declinedAt: { type: 'datetime', columnType: 'timestamptz', nullable: true },
    declineReason: { type: 'text', nullable: true },
    depositCents: { type: 'integer', default: 0 },
    depositPaidCents: { type: 'integer', default: 0 },
    depositRefundedCents: { type: 'integer', default: 0 },
    checkoutSessionId: { type: 'string', length: 255, nullable: true },
    paymentIntentId: { type: 'string', length: 255, nullable: true },
    convertedStage: { kind: 'm:1', entity: () => Stage, nullable: true, deleteRule: 'set null' },
    createdBy: { kind: 'm:1', entity: () => User, nullable: true, deleteRule: 'set null' },
    updatedAt: { type: 'datetime', columnType: 'timestamptz' },
  },
});

export const PlanVersionSchema = new EntitySchema<PlanVersion, ShopOwnedEntity>({
  class: PlanVersion,
  extends: ShopOwnedSchema,
  tableName: 'plan_version',
  uniques: [{ properties: ['plan', 'version'] }],
  properties: {
    plan: { kind: 'm:1', entity: () => Plan, deleteRule: 'cascade' },
    version: { type: 'integer' },
    sentTo: { type: 'string', length: 320 },
    title: { type: 'string', length: 200 },
    items: { type: 'json' },
    totalCostCents: { type: 'integer' },
    depositCents: { type: 'integer' },
    currency: { type: 'string', length: 3 },
    prediction: { type: 'json' },
    pdfKey: { type: 'string', length: 500 },
  },
});

export const PaymentEventSchema = new EntitySchema<PaymentEvent>({
  class: PaymentEvent,
  tableName: 'payment_event',
  properties: {
    eventId: { type: 'string', length: 255, primary: true },
    type: { type: 'string', length: 100 },
    plan: { kind: 'm:1', entity: () => Plan, nullable: true, deleteRule: 'set null' },
    outcome: { type: 'string', length: 64 },
    receivedAt: { type: 'datetime', columnType: 'timestamptz' },
  },
});
