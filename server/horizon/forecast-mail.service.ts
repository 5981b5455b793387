import { UNIT_WORDS } from '../../shared/schemas/master-data';
import type { ForecastMailRequest, ForecastMailResponse } from '../../shared/schemas/horizon';
import { recordAudit } from '../audit/audit.service';
import { NotFoundError } from '../errors';
import { enqueueMail } from '../outbox/outbox.service';
import type { AuthenticatedUser } from '../http/request-user';
import { SupplierEntity } from '../master-data/supplier.entity';
import { demandToCsv } from './horizon-csv';
import type { PlanningService } from '../planning/planning.service';
import type { Database } from '../db/database';

/** Sends a supplier its gross demand ahead as a CSV attachment, through the outbox. */
export class ForecastMailService {
  constructor(
    private readonly db: Database,
    private readonly planning: PlanningService,
  ) {}

  async send(request: ForecastMailRequest, actor: AuthenticatedUser): Promise<ForecastMailResponse> {
    const supplier = await this.db.manager.getRepository(SupplierEntity).findOneBy({ code: request.supplier });
    if (!supplier) throw new NotFoundError(`No supplier ${request.supplier}.`);
    const demand = await this.planning.demand({ from: request.from, to: request.to, supplierCode: supplier.code });
    const from = demand.days[0] ?? request.from ?? '';
    const until = demand.days.at(-1) ?? request.to ?? '';
    const subject = `Demand forecast ${from} to ${until} for ${supplier.name}`;
    const lines = demand.rows.map(
      (row) => `  ${row.partNumber.padEnd(16)} ${String(row.total).padStart(10)} ${UNIT_WORDS[row.uom] ?? row.uom}`,
    );
    const text = [
      `Hello ${supplier.name},`,
      '',
      `Attached is our gross demand for your parts per working day from ${from} to ${until}.`,
      'It is a forecast for your planning, not an order; releases follow separately.',
      '',
      demand.rows.length > 0 ? 'Totals over the period:' : 'No demand for your parts in this period.',
      ...lines,
      '',
      `Sent by ${actor.name} (${actor.email}) from Cardloop.`,
    ].join('\n');
    await this.db.write(async (manager) => {
      await enqueueMail(manager, {
        to: supplier.email,
        subject,
        text,
        attachments: [
          { filename: `forecast-${supplier.code}-${from}.csv`, content: demandToCsv(demand), contentType: 'text/csv' },
        ],
      });
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'send',
        entity: 'forecast',
        entityKey: supplier.code,
        changes: { from, until, parts: demand.rows.length },
      });
    });
    return { to: supplier.email, subject, parts: demand.rows.length, from, until };
  }
}
