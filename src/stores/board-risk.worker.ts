import { boardRiskHandler, type BoardRiskRequest } from './board-risk-engine';

/** The board's line-risk engine off the page's main thread (see board-risk-engine.ts). */
const handle = boardRiskHandler();

export interface BoardRiskMessage {
  id: number;
  request: BoardRiskRequest;
}

export type BoardRiskReply = { id: number; ok: true; value: unknown } | { id: number; ok: false; message: string };

self.onmessage = ({ data }: MessageEvent<BoardRiskMessage>) => {
  let reply: BoardRiskReply;
  try {
    reply = { id: data.id, ok: true, value: handle(data.request) };
  } catch (error) {
    reply = { id: data.id, ok: false, message: error instanceof Error ? error.message : String(error) };
  }
  self.postMessage(reply);
};
