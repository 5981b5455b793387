import { markRaw, type Component } from 'vue';
import {
  Box,
  Checked,
  CircleCheck,
  CircleClose,
  EditPen,
  Promotion,
  Van,
  WarningFilled,
} from '@element-plus/icons-vue';
import type { ReleaseStatus } from '@shared/schemas/releases';

/**
 * Our own picture for each release status, shown beside its word: a pen while drafted, a paper
 * plane once mailed, a van on the road, a box when part has come in.
 */
export const RELEASE_STATUS_ICONS: Record<ReleaseStatus, Component> = {
  draft: markRaw(EditPen),
  sent: markRaw(Promotion),
  confirmed: markRaw(CircleCheck),
  exception: markRaw(WarningFilled),
  shipped: markRaw(Van),
  partial: markRaw(Box),
  received: markRaw(Checked),
  cancelled: markRaw(CircleClose),
};
