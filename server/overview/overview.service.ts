import { In, Not } from 'typeorm';
import { addWorkingDays, workingDaysBetween } from '../../shared/domain/calendar';
import { formatDay } from '../../shared/format/dates';
import type { Overview, OverviewFigure } from '../../shared/schemas/overview';
import type { Role } from '../../shared/schemas/user';
import { readCalendar } from '../calendar/calendar.service';
import type { Database } from '../db/database';
import type { DockService } from '../dock/dock.service';
import type { AuthenticatedUser } from '../http/request-user';
import type { LineRiskService } from '../line-risk/line-risk.service';
import type { LoopsService } from '../loops/loops.service';
import type { OutboxService } from '../outbox/outbox.service';
import { plantToday } from '../planning/plan-dates';
import { ReleaseLineEntity } from '../releases/release-line.entity';
import { ReleaseEntity } from '../releases/release.entity';
import { SequenceEntryEntity } from '../sequence/sequence-entry.entity';
import { readSequenceSettings } from '../sequence/sequence-settings';
import { readSetting, writeSetting } from '../settings/settings';
import { DEMO_ACCOUNTS } from '../users/bootstrap';

/** Setting that remembers one user put the first-run guide away. */
function guideDismissedKey(user: AuthenticatedUser): string {
  return `overview.guideDismissed.${user.id}`;
}

/** Working days ahead the planner's capacity figure covers when the frozen window is shorter. */
const CAPACITY_DAYS = 5;

interface OverviewDeps {
  lineRisk: LineRiskService;
  loops: LoopsService;
  dock: DockService;
  outbox: OutboxService;
}

/**
 * The three figures each role watches, computed from the same services as the screens they link
 * to, so the Overview never says something the screen behind it does not.
 */
export class OverviewService {
  constructor(
    private readonly db: Database,
    private readonly deps: OverviewDeps,
    private readonly today: () => string = plantToday,
  ) {}

  async overview(user: AuthenticatedUser): Promise<Overview> {
    return {
      role: user.role,
      today: this.today(),
      figures: await this.figuresFor(user.role, user),
      firstRunGuide: await this.showsGuide(user),
    };
  }

  /** The first-run guide is for the demo's own accounts, until each person puts it away. */
  private async showsGuide(user: AuthenticatedUser): Promise<boolean> {
    const demoAccounts = await readSetting<string[]>(this.db.manager, DEMO_ACCOUNTS, []);
    if (!demoAccounts.includes(user.email)) return false;
    return !(await readSetting<boolean>(this.db.manager, guideDismissedKey(user), false));
  }

  /** Puts the first-run guide away for this user, on every device; doing it twice changes nothing. */
  dismissGuide(user: AuthenticatedUser): Promise<void> {
    return this.db.write(async (manager) => {
      await writeSetting(manager, guideDismissedKey(user), true);
    });
  }

  private figuresFor(role: Role, user: AuthenticatedUser): Promise<OverviewFigure[]> {
    switch (role) {
      case 'planner':
      case 'viewer':
        return this.planner();
      case 'buyer':
        return this.buyer();
      case 'receiving':
        return this.receiving();
      case 'line':
        return this.line();
      case 'admin':
        return this.admin();
      case 'supplier':
        return this.supplier(user.supplierCode ?? '');
    }
  }

  private async planner(): Promise<OverviewFigure[]> {
    const today = this.today();
    const report = await this.deps.lineRisk.report();
    const { units } = await this.deps.lineRisk.units({}, 0, report.unitsAtRiskCount || 1);
    const frozenUntil = report.frozenUntil;
    const inFrozen = frozenUntil ? units.filter((unit) => unit.date <= frozenUntil).length : 0;
    const calendar = await readCalendar(this.db.manager);
    const firstStop = units[0]?.date ?? null;
    const daysToFirstStop = firstStop ? workingDaysBetween(today, firstStop, calendar).length - 1 : null;
    const capacityUse = await this.capacityUse(today, calendar);
    return [
      {
        key: 'unitsAtRiskFrozen',
        label: 'Units at risk in the frozen window',
        value: inFrozen,
        unit: 'count',
        hint: frozenUntil
          ? `Units to build up to ${formatDay(frozenUntil)} that cannot get every part they need.`
          : 'No frozen window is set.',
        to: '/line-risk',
        attention: inFrozen > 0,
      },
      {
        key: 'daysToFirstStop',
        label: 'Working days to the first stop',
        value: daysToFirstStop,
        unit: 'workingDays',
        hint: firstStop
          ? `The first unit that would stop the line is built on ${formatDay(firstStop)}.`
          : 'No unit in the next four weeks lacks a part.',
        to: '/line-risk',
        attention: daysToFirstStop !== null && daysToFirstStop <= report.frozenWindowDays,
      },
      {
        key: 'capacityUse',
        label: `Capacity used, next ${CAPACITY_DAYS} working days`,
        value: capacityUse,
        unit: 'share',
        hint: 'Units in the build sequence against the line’s daily capacity.',
        to: '/sequence',
        attention: capacityUse !== null && capacityUse > 1,
      },
    ];
  }

  private async capacityUse(today: string, calendar: Awaited<ReturnType<typeof readCalendar>>): Promise<number | null> {
    const { dailyCapacity } = await readSequenceSettings(this.db.manager);
    const last = addWorkingDays(today, CAPACITY_DAYS - 1, calendar);
    const days = workingDaysBetween(today, last, calendar);
    if (dailyCapacity <= 0 || days.length === 0) return null;
    const { sum } = (await this.db.manager
      .createQueryBuilder(SequenceEntryEntity, 'unit')
      .select('COALESCE(SUM(unit.qty), 0)', 'sum')
      .where('unit.date BETWEEN :from AND :to', { from: days[0], to: days[days.length - 1] })
      .getRawOne<{ sum: number | string }>())!;
    return Number(sum) / (dailyCapacity * days.length);
  }

  private async buyer(): Promise<OverviewFigure[]> {
    const [exceptions, shortages, loops] = await Promise.all([
      this.db.manager.countBy(ReleaseEntity, { status: 'exception' }),
      this.deps.lineRisk.shortages(),
      this.deps.loops.listLoops(),
    ]);
    const expedites = shortages.filter((shortage) => shortage.action === 'expedite').length;
    const toResize = loops.filter((loop) => loop.proposal.action !== 'none').length;
    return [
      {
        key: 'exceptionsWaiting',
        label: 'Supplier answers waiting',
        value: exceptions,
        unit: 'count',
        hint: 'Releases whose supplier offered another quantity or date: accept, resend or cancel.',
        to: '/releases',
        attention: exceptions > 0,
      },
      {
        key: 'expedites',
        label: 'Parts to expedite',
        value: expedites,
        unit: 'count',
        hint: 'Short inside the supplier’s lead time: only an expedite or a resequence saves the units.',
        to: '/line-risk',
        attention: expedites > 0,
      },
      {
        key: 'loopsToResize',
        label: 'Loops to resize',
        value: toResize,
        unit: 'count',
        hint: 'Kanban loops whose cards in circulation differ from what demand needs.',
        to: '/loops',
        attention: toResize > 0,
      },
    ];
  }

  private async receiving(): Promise<OverviewFigure[]> {
    const items = await this.deps.dock.list();
    // Cards with something still to count: a counted shipment of a release still under way is done.
    const open = items.filter((item) => item.lines.some((line) => line.open));
    const dueToday = open.filter((item) => item.expectedToday).length;
    const late = open.filter((item) => item.overdue).length;
    const atDock = open.filter((item) => item.column === 'at_dock').length;
    return [
      {
        key: 'dueToday',
        label: 'Deliveries due today',
        value: dueToday,
        unit: 'count',
        hint: 'Shipments and deliveries not yet shipped that are expected at the dock today.',
        to: '/dock',
        attention: false,
      },
      {
        key: 'late',
        label: 'Deliveries late',
        value: late,
        unit: 'count',
        hint: 'Open deliveries whose date has passed: ask the buyer to chase them.',
        to: '/dock',
        attention: late > 0,
      },
      {
        key: 'atDock',
        label: 'Waiting at the dock',
        value: atDock,
        unit: 'count',
        hint: 'Delivered and waiting to be counted in.',
        to: '/dock',
        attention: atDock > 0,
      },
    ];
  }

  private async line(): Promise<OverviewFigure[]> {
    const today = this.today();
    const units = await this.db.manager.find(SequenceEntryEntity, { where: { date: today } });
    const built = units.filter((unit) => unit.status === 'built').length;
    const started = units.filter((unit) => unit.status === 'started').length;
    return [
      {
        key: 'toBuildToday',
        label: 'Units still to build today',
        value: units.length - built,
        unit: 'count',
        hint: 'Units of today’s sequence not yet reported built.',
        to: '/line-end',
        attention: false,
      },
      {
        key: 'builtToday',
        label: 'Units built today',
        value: built,
        unit: 'count',
        hint: 'Each backflushed its parts from stock.',
        to: '/line-end',
        attention: false,
      },
      {
        key: 'startedToday',
        label: 'Units started (kit issued)',
        value: started,
        unit: 'count',
        hint: 'Kits issued to the line and not yet reported built.',
        to: '/line-end',
        attention: false,
      },
    ];
  }

  private async admin(): Promise<OverviewFigure[]> {
    const health = await this.deps.outbox.health();
    const [planner] = await this.planner();
    return [
      {
        key: 'mailFailing',
        label: 'E-mails failing',
        value: health.failing,
        unit: 'count',
        hint: 'Notices the mail server refused; they are retried and can be sent again from the Outbox.',
        to: '/admin/outbox',
        attention: health.failing > 0,
      },
      {
        key: 'mailWaiting',
        label: 'E-mails waiting',
        value: health.pending,
        unit: 'count',
        hint: 'Notices queued for the mail server.',
        to: '/admin/outbox',
        attention: false,
      },
      planner!,
    ];
  }

  private async supplier(code: string): Promise<OverviewFigure[]> {
    const manager = this.db.manager;
    const releases = await manager.find(ReleaseEntity, {
      where: { supplierCode: code, status: Not(In(['cancelled', 'draft'])) },
    });
    const byStatus = (statuses: string[]) =>
      releases.filter((release) => statuses.includes(release.status)).map((release) => release.id);
    const countLines = async (ids: number[]) =>
      ids.length ? manager.countBy(ReleaseLineEntity, { releaseId: In(ids), closed: false }) : 0;
    const toConfirm = await countLines(byStatus(['sent']));
    const toShip = await countLines(byStatus(['confirmed']));
    return [
      {
        key: 'linesToConfirm',
        label: 'Lines to confirm',
        value: toConfirm,
        unit: 'count',
        hint: 'Release lines waiting for your quantity and ship date.',
        to: '/releases',
        attention: toConfirm > 0,
      },
      {
        key: 'linesToShip',
        label: 'Lines to ship',
        value: toShip,
        unit: 'count',
        hint: 'Confirmed lines not yet on their way.',
        to: '/releases',
        attention: false,
      },
    ];
  }
}
