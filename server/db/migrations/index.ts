import { InitialSchema1764626400000 } from './1764626400000-initial-schema';
import { ReceiptFinal1764720000000 } from './1764720000000-receipt-final';
import { OutboxDelivery1764800000000 } from './1764800000000-outbox-delivery';
import { Sessions1764810000000 } from './1764810000000-sessions';
import { StockLedger1764900000000 } from './1764900000000-stock-ledger';
import { AttachmentContent1764950000000 } from './1764950000000-attachment-content';
import { SupplierTiming1765000000000 } from './1765000000000-supplier-timing';
import { OpenOrders1765050000000 } from './1765050000000-open-orders';
import { PartSafety1765100000000 } from './1765100000000-part-safety';
import { ShipNotices1765150000000 } from './1765150000000-ship-notices';
import { DockShipments1765200000000 } from './1765200000000-dock-shipments';
import { OverReceipts1765210000000 } from './1765210000000-over-receipts';
import { PlanningPieces1765260000000 } from './1765260000000-planning-pieces';
import { PlanningRevisions1765300000000 } from './1765300000000-planning-revisions';

/** Every migration in order; listed by hand so the bundled and tsx runs see the same set. */
export const migrations = [
  InitialSchema1764626400000,
  ReceiptFinal1764720000000,
  OutboxDelivery1764800000000,
  Sessions1764810000000,
  StockLedger1764900000000,
  AttachmentContent1764950000000,
  SupplierTiming1765000000000,
  OpenOrders1765050000000,
  PartSafety1765100000000,
  ShipNotices1765150000000,
  DockShipments1765200000000,
  OverReceipts1765210000000,
  PlanningPieces1765260000000,
  PlanningRevisions1765300000000,
];
