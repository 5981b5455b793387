import { AuditEventEntity } from '../audit/audit-event.entity';
import { BomLineEntity } from '../bom/bom-line.entity';
import { HolidayEntity } from '../calendar/holiday.entity';
import { ConfirmationTokenEntity } from '../confirm/confirmation-token.entity';
import { CardScanEntity } from '../kanban/card-scan.entity';
import { KanbanCardEntity } from '../kanban/kanban-card.entity';
import { KanbanLoopEntity } from '../kanban/kanban-loop.entity';
import { OutboxMessageEntity } from '../mail/outbox-message.entity';
import { PartEntity } from '../parts/part.entity';
import { AttachmentEntity } from '../receipts/attachment.entity';
import { ReceiptEntity } from '../receipts/receipt.entity';
import { ReleaseLineEntity } from '../releases/release-line.entity';
import { ReleaseEntity } from '../releases/release.entity';
import { SequenceEntryEntity } from '../sequence/sequence-entry.entity';
import { SettingEntity } from '../settings/setting.entity';
import { SupplierEntity } from '../suppliers/supplier.entity';
import { UserEntity } from '../users/user.entity';

export const entities = [
  AttachmentEntity,
  AuditEventEntity,
  BomLineEntity,
  CardScanEntity,
  ConfirmationTokenEntity,
  HolidayEntity,
  KanbanCardEntity,
  KanbanLoopEntity,
  OutboxMessageEntity,
  PartEntity,
  ReceiptEntity,
  ReleaseEntity,
  ReleaseLineEntity,
  SequenceEntryEntity,
  SettingEntity,
  SupplierEntity,
  UserEntity,
];
