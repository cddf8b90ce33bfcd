import { Op, type Transaction } from 'sequelize';
import {
  CYCLE_SETTING_SOURCES, cycleSettingsSchema, defaultCycleSettings, replanOpenTasks, type CycleSettings, type CycleSettingsDto,
  type CycleSettingsPatchInput, type CycleSettingsSaveDto,
} from '@burrowline/shared';
import { withTenant } from '../../db/tenant';
import type { SessionUser } from '../../lib/session-user';
import { AppError } from '../../lib/app-error';
import { recordChanges } from '../audit/audit.service';
import { ensureCan, farmOf } from '../farms/farm-access';
import { announceAlmanac } from './almanac-events.service';
import { farmClockOf } from '../farms/farm-clock';
import { FarmCycleSettings } from './cycle-settings.model';
import { AlmanacTask } from './task.model';
import { insertPlannedTasks, skipTasks, toTaskRecord } from './task-writer.service';

export interface StoredSettings {
  settings: CycleSettings;
  version: number;
  isDefault: boolean;
  updatedAt: Date | null;
}

/** A farm's cycle settings inside the caller's transaction (the published defaults until it changes one). */
export async function settingsOf(tx: Transaction, farmId: string): Promise<StoredSettings> {
  const row = await FarmCycleSettings.findByPk(farmId, { transaction: tx });
  if (!row) return { settings: defaultCycleSettings(), version: 0, isDefault: true, updatedAt: null };
  // Stored before a later setting existed: the default fills it in.
  return { settings: { ...defaultCycleSettings(), ...row.settings }, version: row.version, isDefault: false, updatedAt: row.updatedAt };
}

function present(farmId: string, stored: StoredSettings): CycleSettingsDto {
  return {
    farmId,
    settings: stored.settings,
    isDefault: stored.isDefault,
    sources: CYCLE_SETTING_SOURCES,
    version: stored.version,
    updatedAt: stored.updatedAt?.toISOString() ?? null,
  };
}

/** The actor's farm's cycle settings, each default with its published range and source. */
export async function getCycleSettings(actor: SessionUser): Promise<CycleSettingsDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'read', 'CycleSettings', { farmId }, 'Those settings');
  return withTenant(actor, async (tx) => present(farmId, await settingsOf(tx, farmId)));
}

/**
 * Changes some of the farm's cycle settings from the version the editor saw (else 409), checks the
 * whole set (the order of the days), and re-plans the farm's open tasks: done and skipped tasks are
 * history, a moved task keeps the date chosen for it, a weigh-in age taken out skips its open tasks and
 * a new age adds tasks from today on. Kept in the record's history.
 */
export async function updateCycleSettings(actor: SessionUser, patch: CycleSettingsPatchInput): Promise<CycleSettingsSaveDto> {
  const farmId = farmOf(actor);
  ensureCan(actor, 'update', 'CycleSettings', { farmId }, 'Those settings', 'Only members of the farm change its cycle settings');
  return withTenant(actor, async (tx) => {
    const row = await FarmCycleSettings.findByPk(farmId, { transaction: tx, lock: tx.LOCK.UPDATE });
    const stored = await settingsOf(tx, farmId);
    if (stored.version !== patch.version) throw AppError.staleVersion();
    const { version: _version, ...changes } = patch;
    const parsed = cycleSettingsSchema.safeParse({ ...stored.settings, ...changes });
    if (!parsed.success) {
      const details: Record<string, string[]> = {};
      for (const issue of parsed.error.issues) (details[issue.path.join('.') || '_'] ??= []).push(issue.message);
      throw AppError.validation(details);
    }
    const next = parsed.data;
    const changed: Record<string, [unknown, unknown]> = {};
    for (const key of Object.keys(next) as (keyof CycleSettings)[]) {
      if (JSON.stringify(stored.settings[key]) !== JSON.stringify(next[key])) changed[key] = [stored.settings[key], next[key]];
    }
    if (Object.keys(changed).length === 0) return { ...present(farmId, stored), replanned: { changed: 0, skipped: 0, added: 0 } };

    let saved: FarmCycleSettings;
    if (row) {
      row.set({ settings: next, updatedBy: actor.id });
      saved = await row.save({ transaction: tx });
    } else {
      saved = await FarmCycleSettings.create({ farmId, coopId: actor.coopId, settings: next, updatedBy: actor.id }, { transaction: tx });
      // The defaults were version 0: the first stored set is version 1, so an editor still on the defaults gets a 409.
      saved.changed('settings', true);
      saved = await saved.save({ transaction: tx });
    }
    await recordChanges({ coopId: actor.coopId, tableName: 'farm_cycle_settings', recordId: farmId, actorUserId: actor.id, changes: changed }, tx);

    const replanned = await replanFarm(tx, actor.coopId, farmId, next);
    announceAlmanac(tx, [farmId]);
    return {
      ...present(farmId, { settings: next, version: saved.version, isDefault: false, updatedAt: saved.updatedAt }),
      replanned,
    };
  });
}

/** Re-plans the open tasks of every record of the farm that still has one, under new settings. */
async function replanFarm(tx: Transaction, coopId: string, farmId: string, settings: CycleSettings) {
  const open = await AlmanacTask.findAll({ where: { farmId, state: { [Op.in]: ['open', 'moved'] } }, attributes: ['sourceId'], transaction: tx });
  const sourceIds = [...new Set(open.map((t) => t.sourceId))];
  if (sourceIds.length === 0) return { changed: 0, skipped: 0, added: 0 };
  const tasks = await AlmanacTask.findAll({ where: { farmId, sourceId: { [Op.in]: sourceIds } }, transaction: tx, lock: tx.LOCK.UPDATE });
  const { today } = await farmClockOf(tx, coopId, farmId);
  const plan = replanOpenTasks(tasks.map(toTaskRecord), settings, today);
  const byId = new Map(tasks.map((t) => [t.id, t]));
  for (const change of plan.changed) {
    const task = byId.get(change.id)!;
    task.set({ dueOn: change.dueOn, ...(change.windowStart ? { windowStart: change.windowStart, windowEnd: change.windowEnd! } : {}) });
    await task.save({ transaction: tx });
  }
  await skipTasks(tx, plan.skipped);
  for (const added of plan.added) {
    const sibling = tasks.find((t) => t.sourceId === added.sourceId)!;
    await insertPlannedTasks(
      tx,
      { coopId, farmId, sourceId: added.sourceId, serviceId: sibling.serviceId, litterId: sibling.litterId, animalId: sibling.animalId },
      [added],
    );
  }
  return { changed: plan.changed.length, skipped: plan.skipped.length, added: plan.added.length };
}
