import { markRaw, type Component } from 'vue';
import { Box, Calendar, Finished, Setting, ShoppingCart, Van, View } from '@element-plus/icons-vue';
import type { Role } from '@shared/schemas/user';

type TagType = 'primary' | 'success' | 'info' | 'warning' | 'danger';

/**
 * Icon and colour for each role's tag; the word is always shown beside them. Status colours
 * (green, amber, red) stay free for states such as late or short, so roles use teal and grey.
 */
export const ROLE_BADGES: Record<Role, { icon: Component; tagType: TagType }> = {
  admin: { icon: markRaw(Setting), tagType: 'primary' },
  planner: { icon: markRaw(Calendar), tagType: 'primary' },
  buyer: { icon: markRaw(ShoppingCart), tagType: 'primary' },
  receiving: { icon: markRaw(Box), tagType: 'primary' },
  line: { icon: markRaw(Finished), tagType: 'primary' },
  supplier: { icon: markRaw(Van), tagType: 'info' },
  viewer: { icon: markRaw(View), tagType: 'info' },
};

/** One sentence per role on what that person gets done here. */
export const ROLE_DUTIES: Record<Role, string> = {
  admin:
    'You look after users and roles, the plant calendar, the time of the daily release job and the outbox of notices.',
  planner: 'You own the build sequence: import and edit it, freeze the next days and watch which units are at risk.',
  buyer: 'You keep parts, suppliers and bills of materials, read demand ahead, size kanban loops and send releases.',
  receiving: 'You check deliveries in at the dock, record counts and discrepancies, and move stock to the line.',
  line: 'You report each unit built as it leaves the line, so its parts come off stock; you open and print each unit’s kit, and record parts scrapped at the line.',
  supplier:
    'You see the demand for your parts, your releases, your scorecard and the dock’s claims; you answer each release from the link in its e-mail.',
  viewer: 'You can read plans, loops and deliveries; changes are made by the people who own them.',
};
