/** Every entity schema, in one list for the ORM config. Add new schemas here. */
import { ShopSchema } from '../modules/shops/shop.entity';
import { ShopOwnedSchema } from './base-entity';
import { UserSchema, AuthTokenSchema } from '../modules/users/user.entity';
import { PendingInviteSchema } from '../modules/users/pending-invite.entity';
import { CustomerSchema } from '../modules/customers/customer.entity';
import { BikeSchema } from '../modules/bikes/bike.entity';
import { DynoSchema } from '../modules/dynos/dyno.entity';
import { DynoSessionSchema } from '../modules/sessions/dyno-session.entity';
import { StageSchema, PartSchema } from '../modules/stages/stage.entity';
import { RunSchema, ColumnLayoutSchema } from '../modules/runs/run.entity';
import { AuditEntrySchema } from '../modules/audit/audit-entry.entity';
import { ComparisonSchema } from '../modules/comparisons/comparison.entity';
import { ReportSchema, ReportDeliverySchema, ShareLinkSchema } from '../modules/reports/report.entity';
import { PlanSchema, PlanVersionSchema, PaymentEventSchema } from '../modules/plans/plan.entity';
import { OrphanObjectSchema } from '../lib/storage/orphan-object.entity';
import { DeviceTokenSchema } from '../modules/device/device-token.entity';
import { InboxItemSchema } from '../modules/device/inbox-item.entity';

export const entities = [
  ShopSchema,
  ShopOwnedSchema,
  UserSchema,
  AuthTokenSchema,
  PendingInviteSchema,
  CustomerSchema,
  BikeSchema,
  DynoSchema,
  DynoSessionSchema,
  StageSchema,
  PartSchema,
  RunSchema,
  ColumnLayoutSchema,
  AuditEntrySchema,
  ComparisonSchema,
  ReportSchema,
  ReportDeliverySchema,
  ShareLinkSchema,
  OrphanObjectSchema,
  DeviceTokenSchema,
  InboxItemSchema,
  PlanSchema,
  PlanVersionSchema,
  PaymentEventSchema,
];
