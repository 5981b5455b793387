import { AuditEventEntity } from '../audit/audit-event.entity';
import { LoginFailureEntity } from '../auth/login-failure.entity';
import { PasswordResetEntity } from '../auth/password-reset.entity';
import { SessionEntity } from '../users/session.entity';
import { BomLineEntity } from '../master-data/bom-line.entity';
import { HolidayEntity } from '../calendar/holiday.entity';
import { IdempotentRequestEntity } from '../http/idempotent-request.entity';
import { StockMovementEntity } from '../stock/stock-movement.entity';
import { ConfirmationTokenEntity } from '../releases/confirmation-token.entity';
import { CardScanEntity } from '../loops/card-scan.entity';
import { KanbanCardEntity } from '../loops/kanban-card.entity';
import { KanbanLoopEntity } from '../loops/kanban-loop.entity';
import { OutboxMessageEntity } from '../outbox/outbox-message.entity';
import { PartEntity } from '../master-data/part.entity';
import { AttachmentEntity } from '../dock/attachment.entity';
import { AttachmentContentEntity } from '../dock/attachment-content.entity';
import { ReceiptEntity } from '../dock/receipt.entity';
import { ReceiptShareEntity } from '../dock/receipt-share.entity';
import { ReleaseLineEntity } from '../releases/release-line.entity';
import { ReleaseEntity } from '../releases/release.entity';
import { SequenceEntryEntity } from '../sequence/sequence-entry.entity';
import { SettingEntity } from '../settings/setting.entity';
import { SupplierEntity } from '../master-data/supplier.entity';
import { UserEntity } from '../users/user.entity';
import { ShipNoticeEntity } from '../ship-notices/ship-notice.entity';
import { ShipNoticeLineEntity } from '../ship-notices/ship-notice-line.entity';
import { ShippingLinkEntity } from '../ship-notices/shipping-link.entity';

export const entities = [
  AttachmentContentEntity,
  AttachmentEntity,
  AuditEventEntity,
  BomLineEntity,
  CardScanEntity,
  ConfirmationTokenEntity,
  HolidayEntity,
  IdempotentRequestEntity,
  KanbanCardEntity,
  KanbanLoopEntity,
  LoginFailureEntity,
  OutboxMessageEntity,
  PartEntity,
  PasswordResetEntity,
  ReceiptEntity,
  ReceiptShareEntity,
  ReleaseEntity,
  ReleaseLineEntity,
  SequenceEntryEntity,
  SessionEntity,
  SettingEntity,
  ShipNoticeEntity,
  ShipNoticeLineEntity,
  ShippingLinkEntity,
  StockMovementEntity,
  SupplierEntity,
  UserEntity,
];
