// Every migration, in order. Listed by hand so that the same code runs under tsx, vitest and a build.
import type { Migration } from './types';
import { migration as createUsers } from './20261202010000-create-users';
import { migration as createUnits } from './20261202010100-create-units';
import { migration as createGateways } from './20261202010200-create-gateways';
import { migration as createAuditLog } from './20261202010300-create-audit-log';
import { migration as createMessages } from './20261202020000-create-messages';
import { migration as createEpisodes } from './20261202020100-create-episodes';
import { migration as createAlerts } from './20261202030000-create-alerts';
import { migration as addGatewayBrokerHash } from './20261202040000-add-gateway-broker-hash';
import { migration as createDrivers } from './20261202050000-create-drivers';
import { migration as partitionMessages } from './20261202045000-partition-messages';
import { migration as plannerDeskB } from './20261202060000-planner-desk-b';
import { migration as episodesHistoryOrderIndex } from './20261202070000-episodes-history-order-index';
import { migration as dropRedundantMessageIndex } from './20261202080000-drop-redundant-message-index';
import { migration as messagesWithoutUnitFk } from './20261202090000-messages-without-unit-fk';
import { migration as messagesPositionsByPrimaryKey } from './20261202100000-messages-positions-by-primary-key';

export const migrations: Migration[] = [createUsers, createUnits, createGateways, createAuditLog, createMessages, createEpisodes, createAlerts, addGatewayBrokerHash, partitionMessages, createDrivers, plannerDeskB, episodesHistoryOrderIndex, dropRedundantMessageIndex, messagesWithoutUnitFk, messagesPositionsByPrimaryKey];
