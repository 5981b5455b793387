import { Router } from 'express';
import { toCsv } from '../../shared/domain/csv';
import {
  receivingClaimsResponseSchema,
  supplierCodeParamsSchema,
  supplierForecastQuerySchema,
  supplierForecastSchema,
  type SupplierForecast,
} from '../../shared/schemas/supplier-account';
import { NotFoundError } from '../errors';
import { READ_ROLES } from '../http/roles';
import { defineRoute, type RouteDeps } from '../http/route';
import type { AuthenticatedUser } from '../http/request-user';
import type { Services } from '../services';

/** A supplier account reaches its own code only; another's answers 404 as if it did not exist. */
function ownCode(code: string, user: AuthenticatedUser): string {
  if (user.role === 'supplier' && user.supplierCode !== code) throw new NotFoundError(`No supplier ${code}.`);
  return code;
}

/** One row per part and day, with the zone, so a spreadsheet can filter firm from forecast. */
export function forecastToCsv(forecast: SupplierForecast): string {
  const rows = forecast.parts.flatMap((part) =>
    part.days.map((day) => [part.partNumber, part.description, part.uom, day.date, day.qty, day.zone]),
  );
  return toCsv(['part_number', 'description', 'uom', 'date', 'qty', 'zone'], rows);
}

export function createSupplierAccountRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.supplierAccount;
  const access = [...READ_ROLES, 'supplier'] as const;

  defineRoute(router, deps, {
    method: 'get',
    path: '/suppliers/:code/forecast',
    summary:
      'Demand for one supplier’s parts by working day, zoned firm (frozen window), planned (inside the part’s lead time) and forecast (JSON, or CSV with format=csv)',
    access,
    params: supplierCodeParamsSchema,
    query: supplierForecastQuerySchema,
    response: supplierForecastSchema,
    produces: ['text/csv'],
    handler: async ({ params, query, user, res }) => {
      const forecast = await service.forecast(ownCode(params.code, user), query);
      if (query.format !== 'csv') return forecast;
      res
        .type('text/csv')
        .attachment(`forecast-${forecast.supplierCode}-${forecast.days[0] ?? 'empty'}.csv`)
        .send(forecastToCsv(forecast));
      return undefined;
    },
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/suppliers/:code/claims',
    summary: 'Receipts the dock recorded short, over, damaged or as the wrong part against one supplier’s releases',
    access,
    params: supplierCodeParamsSchema,
    response: receivingClaimsResponseSchema,
    handler: ({ params, user }) => service.claims(ownCode(params.code, user)),
  });

  return router;
}
