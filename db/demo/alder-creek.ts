/**
 * The demo scenario. Everything here is invented: the Alder Creek Home Repair Program, its
 * county and towns, its streets, homes and clients, the climate called "Alder Creek, demo",
 * the prices, labour rates and material costs. It shows what Sealwork does; no test uses it
 * as an expected value. Each home lives in its own file under homes/; what they share is in
 * homes/shared.ts.
 */
import type { HomeFileInput } from '../../core/schema.ts';
import { BRAMBLE_RUN } from './homes/bramble-run.ts';
import { COLDBROOK_ROAD } from './homes/coldbrook-road.ts';
import { FERNBANK_WAY } from './homes/fernbank-way.ts';
import { FOUNDRY_STREET } from './homes/foundry-street.ts';
import { HERON_COURT } from './homes/heron-court.ts';
import { JUNIPER_HOLLOW } from './homes/juniper-hollow.ts';
import { KESTREL_PARK_LANE } from './homes/kestrel-park-lane.ts';
import { LARCH_TERRACE } from './homes/larch-terrace.ts';
import { MILLRACE_LANE } from './homes/millrace-lane.ts';
import { OLD_MILL_ROAD } from './homes/old-mill-road.ts';
import { OSPREY_LANDING } from './homes/osprey-landing.ts';
import { QUARRY_ROAD } from './homes/quarry-road.ts';
import { ROPEWALK_STREET } from './homes/ropewalk-street.ts';
import { SORREL_RIDGE_DRIVE } from './homes/sorrel-ridge-drive.ts';
import { TANAGER_STREET } from './homes/tanager-street.ts';
import { WICKET_STREET } from './homes/wicket-street.ts';

export { ALDER_CREEK_CLIMATE, DEMO_REGION, DEMO_TOWNS, PRICES } from './homes/shared.ts';

export const DEMO_PROGRAM_NAME = 'Alder Creek Home Repair Program (demo)';

/** The demo homes, oldest first. */
export const DEMO_HOMES: readonly HomeFileInput[] = [
  ROPEWALK_STREET,
  COLDBROOK_ROAD,
  MILLRACE_LANE,
  OLD_MILL_ROAD,
  WICKET_STREET,
  TANAGER_STREET,
  QUARRY_ROAD,
  FOUNDRY_STREET,
  HERON_COURT,
  KESTREL_PARK_LANE,
  OSPREY_LANDING,
  JUNIPER_HOLLOW,
  BRAMBLE_RUN,
  FERNBANK_WAY,
  SORREL_RIDGE_DRIVE,
  LARCH_TERRACE,
];
