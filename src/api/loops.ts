import type { KanbanSizeRequest, KanbanSizeResponse } from '@shared/schemas/loops-sizing';
import type {
  AcceptKanbanLoopResponse,
  CardLabel,
  CardScanRequest,
  CardScanResponse,
  KanbanCardWithScans,
  KanbanLoop,
  UpdateKanbanLoopRequest,
} from '@shared/schemas/loops';
import { download } from './download';
import { http } from './http';

/** Which cards a label print covers: the ones in circulation, or every card ever issued. */
export type LabelSelection = 'active' | 'all';

/** Every kanban loop with its sizing, proposal and card counts; optionally one supplier's only. */
export function listLoops(supplierCode?: string, signal?: AbortSignal): Promise<KanbanLoop[]> {
  return http.get<KanbanLoop[]>('/kanban/loops', { query: { supplier: supplierCode || undefined }, signal });
}

/** One loop, sized on the same plan as the list. */
export function getLoop(id: number, signal?: AbortSignal): Promise<KanbanLoop> {
  return http.get<KanbanLoop>(`/kanban/loops/${id}`, { signal });
}

/**
 * Changes container quantity, safety allowance or sizing window of the loop as it was shown
 * (`version`); bad fields reject with a 400 carrying zod issues, a change someone made first
 * with 409 `stale` carrying the loop as it is.
 */
export function updateLoop(id: number, patch: UpdateKanbanLoopRequest, version: string): Promise<KanbanLoop> {
  return http.patch<KanbanLoop>(`/kanban/loops/${id}`, patch, { ifMatch: version });
}

/**
 * Adds or pulls cards so active equals recommended. `expectedRecommended` is the figure the buyer
 * saw; if demand moved since, the server answers 409 and changes nothing.
 */
export function acceptLoop(id: number, expectedRecommended: number): Promise<AcceptKanbanLoopResponse> {
  return http.post<AcceptKanbanLoopResponse>(`/kanban/loops/${id}/accept`, { expectedRecommended });
}

/** Cards of a loop, pulled ones included, each with its latest scans (newest first). */
export function listCards(loopId: number, signal?: AbortSignal): Promise<KanbanCardWithScans[]> {
  return http.get<KanbanCardWithScans[]>(`/kanban/loops/${loopId}/cards`, { signal });
}

/** What each printed label shows, the QR code included as SVG markup. */
export function listLabels(
  loopId: number,
  cards: LabelSelection = 'active',
  signal?: AbortSignal,
): Promise<CardLabel[]> {
  return http.get<CardLabel[]>(`/kanban/loops/${loopId}/labels`, { query: { cards }, signal });
}

/** Downloads the printable PDF of a loop's labels (eight to an A4 page); resolves to the saved file name. */
export function downloadLabelsPdf(loopId: number, cards: LabelSelection = 'active'): Promise<string> {
  return download(`/kanban/loops/${loopId}/labels.pdf`, `kanban-cards-loop-${loopId}.pdf`, { cards });
}

/** The card-count formula on free numbers; a bad number rejects with a 400 naming the field. */
export function sizeLoopCards(sizing: KanbanSizeRequest, signal?: AbortSignal): Promise<KanbanSizeResponse> {
  return http.post<KanbanSizeResponse>('/kanban/size', sizing, { signal });
}

/** Records one card scan; 400 for a bad number or check digit, 404 unknown card, 409 illegal move. */
export function scanCard(scan: CardScanRequest): Promise<CardScanResponse> {
  return http.post<CardScanResponse>('/kanban/scans', scan);
}
