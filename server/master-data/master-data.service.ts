import type { Part, Supplier } from '../../shared/schemas/master-data';
import type { AuthenticatedUser } from '../http/request-user';
import { PartEntity } from './part.entity';
import { SupplierEntity } from './supplier.entity';
import type { Database } from '../db/database';

function toSupplier(entity: SupplierEntity): Supplier {
  const { id: _id, ...supplier } = entity;
  return supplier;
}

function toPart(entity: PartEntity): Part {
  const { id: _id, ...part } = entity;
  return part as Part;
}

/** Read side of suppliers and parts; a supplier account only ever sees its own. */
export class MasterDataService {
  constructor(private readonly db: Database) {}

  async listSuppliers(viewer: AuthenticatedUser): Promise<Supplier[]> {
    const where = viewer.role === 'supplier' ? { code: viewer.supplierCode ?? '' } : {};
    const suppliers = await this.db.manager.getRepository(SupplierEntity).find({ where, order: { code: 'ASC' } });
    return suppliers.map(toSupplier);
  }

  async listParts(filter: { supplierCode?: string; source?: string }): Promise<Part[]> {
    const parts = await this.db.manager.getRepository(PartEntity).find({
      where: {
        ...(filter.supplierCode && { supplierCode: filter.supplierCode }),
        ...(filter.source && { source: filter.source }),
      },
      order: { partNumber: 'ASC' },
    });
    return parts.map(toPart);
  }
}
