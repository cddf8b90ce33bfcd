import type { Sequelize } from 'sequelize';
import { CalendarFeedToken } from '../modules/almanac/calendar-feed-token.model';
import { FarmCycleSettings } from '../modules/almanac/cycle-settings.model';
import { DigestSubscription } from '../modules/almanac/digest-subscription.model';
import { Palpation } from '../modules/almanac/palpation.model';
import { ServiceRecord } from '../modules/almanac/service-record.model';
import { AlmanacTask } from '../modules/almanac/task.model';
import { Treatment } from '../modules/almanac/treatment.model';
import { AnimalNote } from '../modules/animals/animal-note.model';
import { AnimalStatusEvent } from '../modules/animals/animal-status-event.model';
import { Animal } from '../modules/animals/animal.model';
import { CustodyEvent } from '../modules/animals/custody-event.model';
import { WeighIn } from '../modules/animals/weigh-in.model';
import { ApplicationView } from '../modules/applications/application-view.model';
import { Application } from '../modules/applications/application.model';
import { AuditEvent } from '../modules/audit/audit-event.model';
import { RecordChange } from '../modules/audit/record-change.model';
import { OneTimeToken } from '../modules/one-time-tokens/one-time-token.model';
import { Breed } from '../modules/breeds/breed.model';
import { Cooperative } from '../modules/coops/coop.model';
import { Farm } from '../modules/farms/farm.model';
import { HousingPlacement } from '../modules/litters/housing-placement.model';
import { HousingUnit } from '../modules/litters/housing-unit.model';
import { GrowOutGroup, GrowOutGroupLitter } from '../modules/grow-out/grow-out-group.model';
import { FeedPurchase, FeedUse, FeedUseShare } from '../modules/feed/feed.model';
import { TemperatureReading } from '../modules/health/temperature-reading.model';
import { ProcessingMark, ProcessingRecord } from '../modules/processing/processing-record.model';
import { LitterEvent } from '../modules/litters/litter-event.model';
import { Litter } from '../modules/litters/litter.model';
import { HerdImport } from '../modules/herd-files/herd-import.model';
import { Invitation } from '../modules/members/invitation.model';
import { Photo } from '../modules/photos/photo.model';
import { User } from '../modules/users/user.model';

/** Initialises every model and association once per connection. */
export function initModels(sequelize: Sequelize): void {
  for (const model of [Cooperative, Farm, User, AuditEvent, RecordChange, OneTimeToken]) model.initModel(sequelize);
  // Membership: applications, who has opened them, direct invitations.
  for (const model of [Application, ApplicationView, Invitation]) model.initModel(sequelize);
  // The Herd: breeds, animals and their histories, weigh-ins and notes.
  for (const model of [Breed, Animal, AnimalStatusEvent, CustodyEvent, WeighIn, AnimalNote]) model.initModel(sequelize);
  // The Almanac and litters: cycle settings, services, palpations, treatments, tasks, the feed, the morning e-mail.
  for (const model of [FarmCycleSettings, ServiceRecord, Palpation, Treatment, AlmanacTask, CalendarFeedToken, DigestSubscription]) model.initModel(sequelize);
  for (const model of [Litter, LitterEvent, HousingUnit, HousingPlacement]) model.initModel(sequelize);
  // Grow-out, feed, health and yield.
  for (const model of [GrowOutGroup, GrowOutGroupLitter]) model.initModel(sequelize);
  for (const model of [FeedPurchase, FeedUse, FeedUseShare]) model.initModel(sequelize);
  for (const model of [TemperatureReading, ProcessingRecord, ProcessingMark]) model.initModel(sequelize);
  // Herd records in and out: photos, staged spreadsheets.
  for (const model of [Photo, HerdImport]) model.initModel(sequelize);
  Farm.hasMany(User, { as: 'members', foreignKey: 'farmId' });
  User.belongsTo(Farm, { as: 'farm', foreignKey: 'farmId' });
}
