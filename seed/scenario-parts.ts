import type { Replenishment } from '../shared/domain/types';
import type { DemoUom } from './scenario-types';

/*
 * Part catalogue of the invented floor-scrubber plant. Each entry names the parents it goes
 * into and how many, so the BOM lines are read off the catalogue instead of kept twice.
 * Stations: L1-ST01 frame and wheels … L1-ST11 pack-out on assembly line 1; FAB-C1 is the
 * welding cell that makes frames, decks and handles; SUB-SQ1 the squeegee sub-assembly bench.
 */

export const FS20W = 'FS-20W';
export const FS26W = 'FS-26W';
export const FS32R = 'FS-32R';
export const FS40R = 'FS-40R';

/** End items in catalogue order; the level mix uses this order to break ties. */
export const MODELS: { partNumber: string; description: string }[] = [
  { partNumber: FS20W, description: 'Floor scrubber, walk-behind, 20 in brush deck, 24 V' },
  { partNumber: FS26W, description: 'Floor scrubber, walk-behind, 26 in brush deck, 24 V, traction drive' },
  { partNumber: FS32R, description: 'Floor scrubber, ride-on, 32 in twin-disc deck, 36 V' },
  { partNumber: FS40R, description: 'Floor scrubber, ride-on, 40 in twin-disc deck, 36 V' },
];

const ALL = [FS20W, FS26W, FS32R, FS40R];
const WALK = [FS20W, FS26W];
const RIDE = [FS32R, FS40R];

/** The same quantity per parent for every parent listed. */
function each(parents: string[], qtyPer: number): Record<string, number> {
  return Object.fromEntries(parents.map((parent) => [parent, qtyPer]));
}

export interface MadeEntry {
  partNumber: string;
  description: string;
  leadTimeDays: number;
  pointOfUse: string;
  usedOn: Record<string, number>;
  /** Small sub-assemblies pulled from an in-plant supermarket by kanban, in racks of `packQty`. */
  supermarket?: { packQty: number };
}

/** Sub-assemblies made in-house; their components are in BOUGHT below. */
export const MADE: MadeEntry[] = [
  { partNumber: 'FRM-20W', description: 'Frame weldment, walk-behind 20 in', leadTimeDays: 2, pointOfUse: 'L1-ST01', usedOn: { [FS20W]: 1 } },
  { partNumber: 'FRM-26W', description: 'Frame weldment, walk-behind 26 in', leadTimeDays: 2, pointOfUse: 'L1-ST01', usedOn: { [FS26W]: 1 } },
  { partNumber: 'FRM-32R', description: 'Chassis weldment, ride-on 32 in', leadTimeDays: 3, pointOfUse: 'L1-ST01', usedOn: { [FS32R]: 1 } },
  { partNumber: 'FRM-40R', description: 'Chassis weldment, ride-on 40 in', leadTimeDays: 3, pointOfUse: 'L1-ST01', usedOn: { [FS40R]: 1 } },
  { partNumber: 'DCK-20', description: 'Brush deck weldment, 20 in single disc', leadTimeDays: 2, pointOfUse: 'L1-ST02', usedOn: { [FS20W]: 1 } },
  { partNumber: 'DCK-26', description: 'Brush deck weldment, 26 in single disc', leadTimeDays: 2, pointOfUse: 'L1-ST02', usedOn: { [FS26W]: 1 } },
  { partNumber: 'DCK-32', description: 'Brush deck weldment, 32 in twin disc', leadTimeDays: 2, pointOfUse: 'L1-ST02', usedOn: { [FS32R]: 1 } },
  { partNumber: 'DCK-40', description: 'Brush deck weldment, 40 in twin disc', leadTimeDays: 2, pointOfUse: 'L1-ST02', usedOn: { [FS40R]: 1 } },
  { partNumber: 'SQA-20', description: 'Squeegee assembly for 20 in deck, 28 in wide', leadTimeDays: 1, pointOfUse: 'L1-ST09', usedOn: { [FS20W]: 1 }, supermarket: { packQty: 5 } },
  { partNumber: 'SQA-26', description: 'Squeegee assembly for 26 in deck, 34 in wide', leadTimeDays: 1, pointOfUse: 'L1-ST09', usedOn: { [FS26W]: 1 }, supermarket: { packQty: 5 } },
  { partNumber: 'SQA-32', description: 'Squeegee assembly for 32 in deck, 42 in wide', leadTimeDays: 1, pointOfUse: 'L1-ST09', usedOn: { [FS32R]: 1 }, supermarket: { packQty: 4 } },
  { partNumber: 'SQA-40', description: 'Squeegee assembly for 40 in deck, 50 in wide', leadTimeDays: 1, pointOfUse: 'L1-ST09', usedOn: { [FS40R]: 1 }, supermarket: { packQty: 4 } },
  { partNumber: 'HDL-W', description: 'Handle weldment, walk-behind', leadTimeDays: 1, pointOfUse: 'L1-ST07', usedOn: each(WALK, 1), supermarket: { packQty: 6 } },
];

export interface BoughtEntry {
  partNumber: string;
  description: string;
  supplierCode: string;
  packQty: number;
  replenishment: Replenishment;
  pointOfUse: string;
  usedOn: Record<string, number>;
  uom?: DemoUom;
  scrapPct?: number;
  safetyStock?: number;
  hazardous?: boolean;
}

const DECKS = ['DCK-20', 'DCK-26', 'DCK-32', 'DCK-40'];
const SQUEEGEES = ['SQA-20', 'SQA-26', 'SQA-32', 'SQA-40'];

/** Bought parts, grouped by supplier. */
export const BOUGHT: BoughtEntry[] = [
  // Sheet, section and finishing materials for the welding cell, bought by weight or length.
  { partNumber: 'STL-SHT-20', description: 'Sheet steel 2.0 mm, cut blanks', supplierCode: 'HSS', uom: 'KGM', packQty: 500, replenishment: 'scheduled', pointOfUse: 'FAB-C1', scrapPct: 3, usedOn: { 'DCK-20': 9.5, 'DCK-26': 12.5, 'DCK-32': 16, 'DCK-40': 19.5, 'HDL-W': 1.2 } },
  { partNumber: 'STL-SHT-30', description: 'Sheet steel 3.0 mm, cut blanks', supplierCode: 'HSS', uom: 'KGM', packQty: 500, replenishment: 'scheduled', pointOfUse: 'FAB-C1', scrapPct: 3, usedOn: { 'FRM-20W': 18.5, 'FRM-26W': 22, 'FRM-32R': 41.5, 'FRM-40R': 52 } },
  { partNumber: 'STL-PLT-50', description: 'Plate steel 5.0 mm, cut blanks', supplierCode: 'HSS', uom: 'KGM', packQty: 1000, replenishment: 'scheduled', pointOfUse: 'FAB-C1', scrapPct: 3, usedOn: { 'FRM-32R': 14, 'FRM-40R': 18.5 } },
  { partNumber: 'STL-TUB-25', description: 'Steel tube 25 x 2 mm, 6 m lengths', supplierCode: 'HSS', uom: 'MTR', packQty: 60, replenishment: 'scheduled', pointOfUse: 'FAB-C1', scrapPct: 2, usedOn: { 'HDL-W': 2.4, 'FRM-32R': 3.2, 'FRM-40R': 3.6 } },
  { partNumber: 'STL-ANG-40', description: 'Steel angle 40 x 40 x 4 mm, 6 m lengths', supplierCode: 'HSS', uom: 'MTR', packQty: 60, replenishment: 'scheduled', pointOfUse: 'FAB-C1', scrapPct: 2, usedOn: { 'FRM-20W': 1.8, 'FRM-26W': 2.1, 'FRM-32R': 3, 'FRM-40R': 3.4 } },
  { partNumber: 'STL-FLT-50', description: 'Steel flat bar 50 x 6 mm, 6 m lengths', supplierCode: 'HSS', uom: 'MTR', packQty: 60, replenishment: 'kanban', pointOfUse: 'FAB-C1', scrapPct: 2, usedOn: { 'DCK-20': 0.8, 'DCK-26': 1, 'DCK-32': 1.4, 'DCK-40': 1.6 } },
  { partNumber: 'PWD-GRY', description: 'Powder coating, charcoal grey', supplierCode: 'HSS', uom: 'KGM', packQty: 25, replenishment: 'kanban', pointOfUse: 'FAB-C1', scrapPct: 5, usedOn: { 'FRM-20W': 0.6, 'FRM-26W': 0.7, 'FRM-32R': 1.4, 'FRM-40R': 1.7, 'DCK-20': 0.4, 'DCK-26': 0.5, 'DCK-32': 0.7, 'DCK-40': 0.8, 'HDL-W': 0.2 } },
  { partNumber: 'WLD-W10', description: 'Welding wire 1.0 mm, 15 kg spool', supplierCode: 'HSS', uom: 'KGM', packQty: 15, replenishment: 'kanban', pointOfUse: 'FAB-C1', usedOn: { 'FRM-20W': 0.25, 'FRM-26W': 0.3, 'FRM-32R': 0.6, 'FRM-40R': 0.7 } },

  // Fastener kits and loose hardware.
  { partNumber: 'FK-FRM', description: 'Fastener kit, frame weldment', supplierCode: 'PFK', packQty: 50, replenishment: 'kanban', pointOfUse: 'FAB-C1', safetyStock: 25, usedOn: { 'FRM-20W': 1, 'FRM-26W': 1, 'FRM-32R': 2, 'FRM-40R': 2 } },
  { partNumber: 'FK-DCK', description: 'Fastener kit, brush deck', supplierCode: 'PFK', packQty: 50, replenishment: 'kanban', pointOfUse: 'FAB-C1', usedOn: each(DECKS, 1) },
  { partNumber: 'FK-SQA', description: 'Fastener kit, squeegee assembly', supplierCode: 'PFK', packQty: 50, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', usedOn: each(SQUEEGEES, 1) },
  { partNumber: 'FK-HDL', description: 'Fastener kit, handle', supplierCode: 'PFK', packQty: 50, replenishment: 'kanban', pointOfUse: 'FAB-C1', usedOn: { 'HDL-W': 1 } },
  { partNumber: 'FK-TNK', description: 'Fastener kit, tank mounting', supplierCode: 'PFK', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST04', usedOn: each(ALL, 1) },
  { partNumber: 'FK-BAT', description: 'Battery hold-down kit', supplierCode: 'PFK', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST08', usedOn: each(ALL, 1) },
  { partNumber: 'FK-FIN', description: 'Fastener kit, final assembly', supplierCode: 'PFK', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST10', safetyStock: 25, usedOn: each(ALL, 1) },
  { partNumber: 'FK-OPS', description: 'Fastener kit, operator platform', supplierCode: 'PFK', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(RIDE, 1) },
  { partNumber: 'BLT-M8-25', description: 'Hex bolt M8 x 25, zinc plated', supplierCode: 'PFK', packQty: 500, replenishment: 'kanban', pointOfUse: 'L1-ST01', usedOn: { [FS20W]: 12, [FS26W]: 12, [FS32R]: 20, [FS40R]: 24 } },
  { partNumber: 'NUT-M8', description: 'Lock nut M8, nylon insert', supplierCode: 'PFK', packQty: 1000, replenishment: 'kanban', pointOfUse: 'L1-ST01', usedOn: { [FS20W]: 12, [FS26W]: 12, [FS32R]: 20, [FS40R]: 24 } },
  { partNumber: 'WSH-M8', description: 'Flat washer M8', supplierCode: 'PFK', packQty: 1000, replenishment: 'kanban', pointOfUse: 'L1-ST01', usedOn: { [FS20W]: 24, [FS26W]: 24, [FS32R]: 40, [FS40R]: 48 } },
  { partNumber: 'BLT-M10-30', description: 'Hex bolt M10 x 30, zinc plated', supplierCode: 'PFK', packQty: 250, replenishment: 'kanban', pointOfUse: 'L1-ST03', usedOn: each(RIDE, 8) },
  { partNumber: 'NUT-M10', description: 'Lock nut M10, nylon insert', supplierCode: 'PFK', packQty: 500, replenishment: 'kanban', pointOfUse: 'L1-ST03', usedOn: each(RIDE, 8) },
  { partNumber: 'CTY-200', description: 'Cable tie 200 mm, black', supplierCode: 'PFK', packQty: 1000, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: { [FS20W]: 20, [FS26W]: 20, [FS32R]: 35, [FS40R]: 35 } },
  { partNumber: 'GRM-16', description: 'Cable grommet 16 mm', supplierCode: 'PFK', packQty: 500, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: { [FS20W]: 4, [FS26W]: 4, [FS32R]: 6, [FS40R]: 6 } },

  // Casters and wheels.
  { partNumber: 'CST-75S', description: 'Swivel caster 75 mm, non-marking', supplierCode: 'ECW', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST01', usedOn: each(WALK, 2) },
  { partNumber: 'WHL-250', description: 'Rear wheel 250 mm, non-marking', supplierCode: 'ECW', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST01', usedOn: { [FS20W]: 2 } },
  { partNumber: 'WHL-300', description: 'Drive wheel 300 mm, walk-behind', supplierCode: 'ECW', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST01', usedOn: { [FS26W]: 2 } },
  { partNumber: 'WHL-DRV-R', description: 'Front drive wheel 300 mm, ride-on', supplierCode: 'ECW', packQty: 4, replenishment: 'kanban', pointOfUse: 'L1-ST03', usedOn: each(RIDE, 1) },
  { partNumber: 'WHL-REAR-R', description: 'Rear wheel 350 mm, ride-on', supplierCode: 'ECW', packQty: 8, replenishment: 'kanban', pointOfUse: 'L1-ST01', usedOn: each(RIDE, 2) },
  { partNumber: 'SQW-50', description: 'Squeegee wheel 50 mm', supplierCode: 'ECW', packQty: 50, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', usedOn: { 'SQA-20': 2, 'SQA-26': 2, 'SQA-32': 4, 'SQA-40': 4 } },
  { partNumber: 'GRL-60', description: 'Deck guide roller 60 mm', supplierCode: 'ECW', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS20W]: 1, [FS26W]: 1, [FS32R]: 2, [FS40R]: 2 } },
  { partNumber: 'BMR-80', description: 'Bumper roller 80 mm', supplierCode: 'ECW', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST01', usedOn: each(RIDE, 2) },
  { partNumber: 'AXL-20', description: 'Rear axle kit, walk-behind 20 in', supplierCode: 'ECW', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST01', usedOn: { [FS20W]: 1 } },
  { partNumber: 'AXL-R', description: 'Rear axle kit, ride-on', supplierCode: 'ECW', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST01', usedOn: each(RIDE, 1) },
  { partNumber: 'HCP-01', description: 'Wheel hub cap', supplierCode: 'ECW', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST01', usedOn: { [FS20W]: 2, [FS26W]: 2, [FS32R]: 3, [FS40R]: 3 } },

  // Traction batteries (dangerous goods) and charging.
  { partNumber: 'BAT-12-105', description: 'Battery 12 V 105 Ah, AGM', supplierCode: 'FBS', packQty: 4, replenishment: 'scheduled', pointOfUse: 'L1-ST08', hazardous: true, safetyStock: 4, usedOn: { [FS20W]: 2 } },
  { partNumber: 'BAT-06-225', description: 'Battery 6 V 225 Ah, flooded lead-acid', supplierCode: 'FBS', packQty: 4, replenishment: 'scheduled', pointOfUse: 'L1-ST08', hazardous: true, safetyStock: 8, usedOn: { [FS26W]: 4 } },
  { partNumber: 'BAT-06-312', description: 'Battery 6 V 312 Ah, flooded lead-acid', supplierCode: 'FBS', packQty: 6, replenishment: 'scheduled', pointOfUse: 'L1-ST08', hazardous: true, safetyStock: 12, usedOn: each(RIDE, 6) },
  { partNumber: 'CHG-24-12', description: 'On-board charger 24 V 12 A', supplierCode: 'FBS', packQty: 8, replenishment: 'scheduled', pointOfUse: 'L1-ST08', usedOn: each(WALK, 1) },
  { partNumber: 'CHG-36-20', description: 'On-board charger 36 V 20 A', supplierCode: 'FBS', packQty: 8, replenishment: 'scheduled', pointOfUse: 'L1-ST08', usedOn: each(RIDE, 1) },
  { partNumber: 'BWK-04', description: 'Single-point watering kit, 4 batteries', supplierCode: 'FBS', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST08', usedOn: { [FS26W]: 1 } },
  { partNumber: 'BWK-06', description: 'Single-point watering kit, 6 batteries', supplierCode: 'FBS', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST08', usedOn: each(RIDE, 1) },
  { partNumber: 'BCB-24', description: 'Battery interconnect cable set, 24 V', supplierCode: 'FBS', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST08', usedOn: each(WALK, 1) },
  { partNumber: 'BCB-36', description: 'Battery interconnect cable set, 36 V', supplierCode: 'FBS', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST08', usedOn: each(RIDE, 1) },
  { partNumber: 'BPL-175', description: 'Battery plug 175 A, two-pole', supplierCode: 'FBS', packQty: 25, replenishment: 'kanban', pointOfUse: 'L1-ST08', usedOn: each(ALL, 1) },

  // Brush, vacuum and traction motors, actuators.
  { partNumber: 'BRM-04', description: 'Brush motor 24 V 0.4 kW', supplierCode: 'OMW', packQty: 6, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS20W]: 1 } },
  { partNumber: 'BRM-07', description: 'Brush motor 24 V 0.75 kW', supplierCode: 'OMW', packQty: 6, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS26W]: 1 } },
  { partNumber: 'BRM-R05', description: 'Brush motor 36 V 0.55 kW', supplierCode: 'OMW', packQty: 6, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS32R]: 2 } },
  { partNumber: 'BRM-R07', description: 'Brush motor 36 V 0.75 kW', supplierCode: 'OMW', packQty: 6, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS40R]: 2 } },
  { partNumber: 'VAC-400', description: 'Vacuum motor 24 V 400 W', supplierCode: 'OMW', packQty: 8, replenishment: 'kanban', pointOfUse: 'L1-ST05', usedOn: { [FS20W]: 1 } },
  { partNumber: 'VAC-600', description: 'Vacuum motor 24 V 600 W', supplierCode: 'OMW', packQty: 8, replenishment: 'kanban', pointOfUse: 'L1-ST05', usedOn: { [FS26W]: 1 } },
  { partNumber: 'VAC-650', description: 'Vacuum motor 24 V 600 W, low-noise fan, revision B', supplierCode: 'OMW', packQty: 8, replenishment: 'kanban', pointOfUse: 'L1-ST05', usedOn: { [FS26W]: 1 } },
  { partNumber: 'VAC-R800', description: 'Vacuum motor 36 V 800 W', supplierCode: 'OMW', packQty: 8, replenishment: 'kanban', pointOfUse: 'L1-ST05', usedOn: each(RIDE, 1) },
  { partNumber: 'DRM-W03', description: 'Traction transaxle 24 V 0.3 kW, walk-behind', supplierCode: 'OMW', packQty: 4, replenishment: 'scheduled', pointOfUse: 'L1-ST03', usedOn: { [FS26W]: 1 } },
  { partNumber: 'DRM-R10', description: 'Traction motor 36 V 1.0 kW with gearbox', supplierCode: 'OMW', packQty: 4, replenishment: 'scheduled', pointOfUse: 'L1-ST03', usedOn: { [FS32R]: 1 } },
  { partNumber: 'DRM-R15', description: 'Traction motor 36 V 1.5 kW with gearbox', supplierCode: 'OMW', packQty: 4, replenishment: 'scheduled', pointOfUse: 'L1-ST03', usedOn: { [FS40R]: 1 } },
  { partNumber: 'ACT-SQ24', description: 'Squeegee lift actuator 24 V', supplierCode: 'OMW', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST03', usedOn: { [FS26W]: 1 } },
  { partNumber: 'ACT-SQ36', description: 'Squeegee lift actuator 36 V', supplierCode: 'OMW', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST03', usedOn: each(RIDE, 1) },
  { partNumber: 'ACT-DK36', description: 'Brush deck lift actuator 36 V', supplierCode: 'OMW', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST03', usedOn: each(RIDE, 1) },

  // Controllers, switches and electrical components.
  { partNumber: 'CTL-W24', description: 'Machine controller 24 V, walk-behind', supplierCode: 'GDC', packQty: 5, replenishment: 'scheduled', pointOfUse: 'L1-ST06', safetyStock: 5, usedOn: each(WALK, 1) },
  { partNumber: 'CTL-R36', description: 'Machine controller 36 V, ride-on', supplierCode: 'GDC', packQty: 5, replenishment: 'scheduled', pointOfUse: 'L1-ST06', safetyStock: 5, usedOn: each(RIDE, 1) },
  { partNumber: 'TRC-W24', description: 'Traction controller 24 V 70 A', supplierCode: 'GDC', packQty: 5, replenishment: 'scheduled', pointOfUse: 'L1-ST06', usedOn: { [FS26W]: 1 } },
  { partNumber: 'TRC-R36', description: 'Traction controller 36 V 200 A', supplierCode: 'GDC', packQty: 5, replenishment: 'scheduled', pointOfUse: 'L1-ST06', usedOn: each(RIDE, 1) },
  { partNumber: 'DSP-W', description: 'Control panel display, walk-behind', supplierCode: 'GDC', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(WALK, 1) },
  { partNumber: 'DSP-R', description: 'Dashboard display, ride-on', supplierCode: 'GDC', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(RIDE, 1) },
  { partNumber: 'KSW-01', description: 'Key switch with two keys', supplierCode: 'GDC', packQty: 25, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(ALL, 1) },
  { partNumber: 'EST-01', description: 'Emergency stop button, red mushroom', supplierCode: 'GDC', packQty: 25, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(ALL, 1) },
  { partNumber: 'SSW-01', description: 'Operator presence seat switch', supplierCode: 'GDC', packQty: 25, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(RIDE, 1) },
  { partNumber: 'THR-01', description: 'Accelerator pedal sensor', supplierCode: 'GDC', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(RIDE, 1) },
  { partNumber: 'BAL-W', description: 'Bail switch set, walk-behind handle', supplierCode: 'GDC', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(WALK, 1) },
  { partNumber: 'CBR-10', description: 'Circuit breaker 10 A', supplierCode: 'GDC', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: each(ALL, 2) },
  { partNumber: 'CBR-40', description: 'Circuit breaker 40 A', supplierCode: 'GDC', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: each(WALK, 1) },
  { partNumber: 'CBR-70', description: 'Circuit breaker 70 A', supplierCode: 'GDC', packQty: 25, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: each(RIDE, 1) },
  { partNumber: 'HRN-36', description: 'Horn 36 V', supplierCode: 'GDC', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: each(RIDE, 1) },
  { partNumber: 'BCN-LED', description: 'Warning beacon, amber LED', supplierCode: 'GDC', packQty: 12, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: each(RIDE, 1) },
  { partNumber: 'LMP-LED', description: 'Headlamp LED 36 V', supplierCode: 'GDC', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: each(RIDE, 2) },

  // Wire harnesses and battery cable.
  { partNumber: 'HNS-M20', description: 'Main harness, FS-20W', supplierCode: 'BHC', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: { [FS20W]: 1 } },
  { partNumber: 'HNS-M26', description: 'Main harness, FS-26W', supplierCode: 'BHC', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: { [FS26W]: 1 } },
  { partNumber: 'HNS-M32', description: 'Main harness, FS-32R', supplierCode: 'BHC', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: { [FS32R]: 1 } },
  { partNumber: 'HNS-M40', description: 'Main harness, FS-40R', supplierCode: 'BHC', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: { [FS40R]: 1 } },
  { partNumber: 'HNS-DSH', description: 'Dashboard harness, ride-on', supplierCode: 'BHC', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: each(RIDE, 1) },
  { partNumber: 'HNS-HDL', description: 'Handle harness, walk-behind', supplierCode: 'BHC', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(WALK, 1) },
  { partNumber: 'HNS-BRM', description: 'Brush motor lead 0.8 m', supplierCode: 'BHC', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS20W]: 1, [FS26W]: 1, [FS32R]: 2, [FS40R]: 2 } },
  { partNumber: 'HNS-VAC', description: 'Vacuum motor lead 1.2 m', supplierCode: 'BHC', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST05', usedOn: each(ALL, 1) },
  { partNumber: 'HNS-ACT', description: 'Actuator lead set', supplierCode: 'BHC', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST03', usedOn: { [FS26W]: 1, [FS32R]: 2, [FS40R]: 2 } },
  { partNumber: 'HNS-LGT', description: 'Lighting harness, ride-on', supplierCode: 'BHC', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST06', usedOn: each(RIDE, 1) },
  { partNumber: 'WIR-25-RD', description: 'Battery cable 25 mm2, red', supplierCode: 'BHC', uom: 'MTR', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST08', scrapPct: 2, usedOn: { [FS20W]: 0.8, [FS26W]: 1.2, [FS32R]: 2.5, [FS40R]: 2.8 } },
  { partNumber: 'WIR-25-BK', description: 'Battery cable 25 mm2, black', supplierCode: 'BHC', uom: 'MTR', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST08', scrapPct: 2, usedOn: { [FS20W]: 0.8, [FS26W]: 1.2, [FS32R]: 2.5, [FS40R]: 2.8 } },

  // Rotomoulded tanks and covers.
  { partNumber: 'TNK-S45', description: 'Solution tank 45 L, rotomoulded', supplierCode: 'SRM', packQty: 6, replenishment: 'scheduled', pointOfUse: 'L1-ST04', usedOn: { [FS20W]: 1 } },
  { partNumber: 'TNK-S60', description: 'Solution tank 60 L, rotomoulded', supplierCode: 'SRM', packQty: 6, replenishment: 'scheduled', pointOfUse: 'L1-ST04', usedOn: { [FS26W]: 1 } },
  { partNumber: 'TNK-S110', description: 'Solution tank 110 L, rotomoulded', supplierCode: 'SRM', packQty: 4, replenishment: 'scheduled', pointOfUse: 'L1-ST04', usedOn: { [FS32R]: 1 } },
  { partNumber: 'TNK-S150', description: 'Solution tank 150 L, rotomoulded', supplierCode: 'SRM', packQty: 4, replenishment: 'scheduled', pointOfUse: 'L1-ST04', usedOn: { [FS40R]: 1 } },
  { partNumber: 'TNK-R45', description: 'Recovery tank 45 L, rotomoulded', supplierCode: 'SRM', packQty: 6, replenishment: 'scheduled', pointOfUse: 'L1-ST05', usedOn: { [FS20W]: 1 } },
  { partNumber: 'TNK-R60', description: 'Recovery tank 60 L, rotomoulded', supplierCode: 'SRM', packQty: 6, replenishment: 'scheduled', pointOfUse: 'L1-ST05', usedOn: { [FS26W]: 1 } },
  { partNumber: 'TNK-R110', description: 'Recovery tank 110 L, rotomoulded', supplierCode: 'SRM', packQty: 4, replenishment: 'scheduled', pointOfUse: 'L1-ST05', usedOn: { [FS32R]: 1 } },
  { partNumber: 'TNK-R150', description: 'Recovery tank 150 L, rotomoulded', supplierCode: 'SRM', packQty: 4, replenishment: 'scheduled', pointOfUse: 'L1-ST05', usedOn: { [FS40R]: 1 } },
  { partNumber: 'LID-W', description: 'Recovery tank lid, walk-behind', supplierCode: 'SRM', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST05', usedOn: each(WALK, 1) },
  { partNumber: 'LID-R', description: 'Recovery tank lid, ride-on', supplierCode: 'SRM', packQty: 6, replenishment: 'kanban', pointOfUse: 'L1-ST05', usedOn: each(RIDE, 1) },
  { partNumber: 'CVR-BAT-W', description: 'Battery compartment cover, walk-behind', supplierCode: 'SRM', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST08', usedOn: each(WALK, 1) },
  { partNumber: 'CVR-BAT-R', description: 'Battery compartment cover, ride-on', supplierCode: 'SRM', packQty: 6, replenishment: 'kanban', pointOfUse: 'L1-ST08', usedOn: each(RIDE, 1) },
  { partNumber: 'SHR-R', description: 'Front shroud, ride-on', supplierCode: 'SRM', packQty: 6, replenishment: 'scheduled', pointOfUse: 'L1-ST10', usedOn: each(RIDE, 1) },
  { partNumber: 'DBT-01', description: 'Debris tray', supplierCode: 'SRM', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST05', usedOn: each(ALL, 1) },

  // Pumps, valves, hoses and fluids.
  { partNumber: 'PMP-S24', description: 'Solution pump 24 V', supplierCode: 'TFP', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST04', usedOn: each(WALK, 1) },
  { partNumber: 'PMP-S36', description: 'Solution pump 36 V', supplierCode: 'TFP', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST04', usedOn: each(RIDE, 1) },
  { partNumber: 'SOV-24', description: 'Solution solenoid valve 24 V', supplierCode: 'TFP', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST04', usedOn: each(WALK, 1) },
  { partNumber: 'SOV-36', description: 'Solution solenoid valve 36 V', supplierCode: 'TFP', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST04', usedOn: each(RIDE, 1) },
  { partNumber: 'FLT-SOL', description: 'Solution filter, inline', supplierCode: 'TFP', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST04', usedOn: each(ALL, 1) },
  { partNumber: 'HSE-DRN', description: 'Drain hose with plug', supplierCode: 'TFP', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST05', usedOn: each(ALL, 1) },
  { partNumber: 'HSE-V38', description: 'Vacuum hose 38 mm, 30 m roll', supplierCode: 'TFP', uom: 'MTR', packQty: 30, replenishment: 'kanban', pointOfUse: 'L1-ST05', scrapPct: 3, usedOn: { [FS20W]: 1.4, [FS26W]: 1.6, [FS32R]: 2.2, [FS40R]: 2.4 } },
  { partNumber: 'HSE-S10', description: 'Solution hose 10 mm, 50 m roll', supplierCode: 'TFP', uom: 'MTR', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST04', scrapPct: 3, usedOn: { [FS20W]: 1.2, [FS26W]: 1.5, [FS32R]: 2.5, [FS40R]: 2.8 } },
  { partNumber: 'FLS-01', description: 'Float shut-off, recovery tank', supplierCode: 'TFP', packQty: 25, replenishment: 'kanban', pointOfUse: 'L1-ST05', usedOn: each(ALL, 1) },
  { partNumber: 'CAP-FIL', description: 'Fill cap, solution tank', supplierCode: 'TFP', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST04', usedOn: each(ALL, 1) },
  { partNumber: 'HCL-KIT', description: 'Hose clamp kit', supplierCode: 'TFP', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST04', usedOn: each(ALL, 1) },
  { partNumber: 'LUB-GR', description: 'Gear oil 80W-90, 20 L drum', supplierCode: 'TFP', uom: 'LTR', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST03', usedOn: { [FS32R]: 0.6, [FS40R]: 0.8 } },

  // Squeegee blades, squeegee frames, seals and skirts.
  { partNumber: 'SQB-F20', description: 'Squeegee blade, front, 28 in', supplierCode: 'WSS', packQty: 25, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', scrapPct: 1, safetyStock: 10, usedOn: { 'SQA-20': 1 } },
  { partNumber: 'SQB-R20', description: 'Squeegee blade, rear, 28 in', supplierCode: 'WSS', packQty: 25, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', scrapPct: 1, safetyStock: 10, usedOn: { 'SQA-20': 1 } },
  { partNumber: 'SQB-F26', description: 'Squeegee blade, front, 34 in', supplierCode: 'WSS', packQty: 25, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', scrapPct: 1, safetyStock: 10, usedOn: { 'SQA-26': 1 } },
  { partNumber: 'SQB-R26', description: 'Squeegee blade, rear, 34 in', supplierCode: 'WSS', packQty: 25, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', scrapPct: 1, safetyStock: 10, usedOn: { 'SQA-26': 1 } },
  { partNumber: 'SQB-F32', description: 'Squeegee blade, front, 42 in', supplierCode: 'WSS', packQty: 25, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', scrapPct: 1, usedOn: { 'SQA-32': 1 } },
  { partNumber: 'SQB-R32', description: 'Squeegee blade, rear, 42 in', supplierCode: 'WSS', packQty: 25, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', scrapPct: 1, usedOn: { 'SQA-32': 1 } },
  { partNumber: 'SQB-F40', description: 'Squeegee blade, front, 50 in', supplierCode: 'WSS', packQty: 25, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', scrapPct: 1, usedOn: { 'SQA-40': 1 } },
  { partNumber: 'SQB-R40', description: 'Squeegee blade, rear, 50 in', supplierCode: 'WSS', packQty: 25, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', scrapPct: 1, usedOn: { 'SQA-40': 1 } },
  { partNumber: 'SQH-20', description: 'Squeegee frame, cast aluminium, 28 in', supplierCode: 'WSS', packQty: 10, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', usedOn: { 'SQA-20': 1 } },
  { partNumber: 'SQH-26', description: 'Squeegee frame, cast aluminium, 34 in', supplierCode: 'WSS', packQty: 10, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', usedOn: { 'SQA-26': 1 } },
  { partNumber: 'SQH-32', description: 'Squeegee frame, cast aluminium, 42 in', supplierCode: 'WSS', packQty: 6, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', usedOn: { 'SQA-32': 1 } },
  { partNumber: 'SQH-40', description: 'Squeegee frame, cast aluminium, 50 in', supplierCode: 'WSS', packQty: 6, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', usedOn: { 'SQA-40': 1 } },
  { partNumber: 'SQK-01', description: 'Squeegee adjustment knob set', supplierCode: 'WSS', packQty: 50, replenishment: 'kanban', pointOfUse: 'SUB-SQ1', usedOn: each(SQUEEGEES, 1) },
  { partNumber: 'GSK-RW', description: 'Recovery lid gasket, walk-behind', supplierCode: 'WSS', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST05', usedOn: each(WALK, 1) },
  { partNumber: 'GSK-RR', description: 'Recovery lid gasket, ride-on', supplierCode: 'WSS', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST05', usedOn: each(RIDE, 1) },
  { partNumber: 'SKT-20', description: 'Deck splash skirt, 20 in', supplierCode: 'WSS', packQty: 25, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS20W]: 1 } },
  { partNumber: 'SKT-26', description: 'Deck splash skirt, 26 in', supplierCode: 'WSS', packQty: 25, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS26W]: 1 } },
  { partNumber: 'SKT-32', description: 'Deck splash skirt, 32 in', supplierCode: 'WSS', packQty: 25, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS32R]: 1 } },
  { partNumber: 'SKT-40', description: 'Deck splash skirt, 40 in', supplierCode: 'WSS', packQty: 25, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS40R]: 1 } },

  // Brushes, pad drivers and pads.
  { partNumber: 'BRU-16', description: 'Disc scrub brush 16 in, polypropylene', supplierCode: 'CBP', packQty: 6, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS32R]: 2 } },
  { partNumber: 'BRU-20', description: 'Disc scrub brush 20 in, polypropylene', supplierCode: 'CBP', packQty: 6, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS20W]: 1, [FS40R]: 2 } },
  { partNumber: 'BRU-26', description: 'Disc scrub brush 26 in, polypropylene', supplierCode: 'CBP', packQty: 6, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS26W]: 1 } },
  { partNumber: 'PDR-16', description: 'Pad driver 16 in', supplierCode: 'CBP', packQty: 6, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: { [FS32R]: 2 } },
  { partNumber: 'PDR-20', description: 'Pad driver 20 in', supplierCode: 'CBP', packQty: 6, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: { [FS20W]: 1, [FS40R]: 2 } },
  { partNumber: 'PDR-26', description: 'Pad driver 26 in', supplierCode: 'CBP', packQty: 6, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: { [FS26W]: 1 } },
  { partNumber: 'PAD-16', description: 'Scrub pad 16 in, medium', supplierCode: 'CBP', packQty: 5, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: { [FS32R]: 2 } },
  { partNumber: 'PAD-20', description: 'Scrub pad 20 in, medium', supplierCode: 'CBP', packQty: 5, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: { [FS20W]: 1, [FS40R]: 2 } },
  { partNumber: 'PAD-26', description: 'Scrub pad 26 in, medium', supplierCode: 'CBP', packQty: 5, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: { [FS26W]: 1 } },
  { partNumber: 'HUB-BR', description: 'Brush drive hub', supplierCode: 'CBP', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST02', usedOn: { [FS20W]: 1, [FS26W]: 1, [FS32R]: 2, [FS40R]: 2 } },

  // Decals, plates and printed matter.
  { partNumber: 'DCL-LGS', description: 'Logo decal, small', supplierCode: 'LLD', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST10', scrapPct: 2, usedOn: each(WALK, 2) },
  { partNumber: 'DCL-LGL', description: 'Logo decal, large', supplierCode: 'LLD', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST10', scrapPct: 2, usedOn: each(RIDE, 2) },
  { partNumber: 'DCL-M20', description: 'Model decal FS-20W', supplierCode: 'LLD', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST10', scrapPct: 2, usedOn: { [FS20W]: 1 } },
  { partNumber: 'DCL-M26', description: 'Model decal FS-26W', supplierCode: 'LLD', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST10', scrapPct: 2, usedOn: { [FS26W]: 1 } },
  { partNumber: 'DCL-M32', description: 'Model decal FS-32R', supplierCode: 'LLD', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST10', scrapPct: 2, usedOn: { [FS32R]: 1 } },
  { partNumber: 'DCL-M40', description: 'Model decal FS-40R', supplierCode: 'LLD', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST10', scrapPct: 2, usedOn: { [FS40R]: 1 } },
  { partNumber: 'DCL-SAF', description: 'Safety label set', supplierCode: 'LLD', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST10', scrapPct: 2, usedOn: each(ALL, 1) },
  { partNumber: 'DCL-BAT', description: 'Battery hazard label set', supplierCode: 'LLD', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST08', usedOn: each(ALL, 1) },
  { partNumber: 'DCL-PW', description: 'Control panel overlay, walk-behind', supplierCode: 'LLD', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(WALK, 1) },
  { partNumber: 'DCL-PR', description: 'Dashboard overlay, ride-on', supplierCode: 'LLD', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(RIDE, 1) },
  { partNumber: 'NPL-01', description: 'Serial number plate', supplierCode: 'LLD', packQty: 250, replenishment: 'kanban', pointOfUse: 'L1-ST10', usedOn: each(ALL, 1) },
  { partNumber: 'MAN-W', description: 'Operator manual, walk-behind', supplierCode: 'LLD', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: each(WALK, 1) },
  { partNumber: 'MAN-R', description: 'Operator manual, ride-on', supplierCode: 'LLD', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: each(RIDE, 1) },

  // Shipping crates and packing material.
  { partNumber: 'CRT-W', description: 'Shipping crate, walk-behind', supplierCode: 'BCP', packQty: 10, replenishment: 'scheduled', pointOfUse: 'L1-ST11', usedOn: each(WALK, 1) },
  { partNumber: 'CRT-R', description: 'Shipping crate, ride-on', supplierCode: 'BCP', packQty: 5, replenishment: 'scheduled', pointOfUse: 'L1-ST11', usedOn: each(RIDE, 1) },
  { partNumber: 'PLT-W', description: 'Pallet 1200 x 800 mm', supplierCode: 'BCP', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: each(WALK, 1) },
  { partNumber: 'PLT-R', description: 'Pallet 1600 x 1200 mm', supplierCode: 'BCP', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: each(RIDE, 1) },
  { partNumber: 'STR-KIT', description: 'Strapping kit', supplierCode: 'BCP', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: each(ALL, 1) },
  { partNumber: 'CNP-04', description: 'Corner protector set of 4', supplierCode: 'BCP', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: each(ALL, 1) },
  { partNumber: 'BAG-W', description: 'Poly cover, walk-behind', supplierCode: 'BCP', packQty: 100, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: each(WALK, 1) },
  { partNumber: 'BAG-R', description: 'Poly cover, ride-on', supplierCode: 'BCP', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST11', usedOn: each(RIDE, 1) },

  // Operator station.
  { partNumber: 'SEA-R', description: 'Operator seat with armrests, ride-on', supplierCode: 'COS', packQty: 4, replenishment: 'scheduled', pointOfUse: 'L1-ST07', usedOn: each(RIDE, 1) },
  { partNumber: 'STW-R', description: 'Steering wheel 300 mm', supplierCode: 'COS', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(RIDE, 1) },
  { partNumber: 'STC-R', description: 'Steering column with chain drive', supplierCode: 'COS', packQty: 5, replenishment: 'scheduled', pointOfUse: 'L1-ST07', usedOn: each(RIDE, 1) },
  { partNumber: 'PDL-R', description: 'Accelerator pedal assembly', supplierCode: 'COS', packQty: 10, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(RIDE, 1) },
  { partNumber: 'GRP-W', description: 'Handle grip pair, walk-behind', supplierCode: 'COS', packQty: 50, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(WALK, 1) },
  { partNumber: 'MAT-R', description: 'Floor mat, ride-on', supplierCode: 'COS', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(RIDE, 1) },
  { partNumber: 'BMP-R', description: 'Rubber bumper strip, 25 m roll', supplierCode: 'COS', uom: 'MTR', packQty: 25, replenishment: 'kanban', pointOfUse: 'L1-ST01', scrapPct: 2, usedOn: { [FS32R]: 2.6, [FS40R]: 3.1 } },
  { partNumber: 'BLT-LAP', description: 'Operator lap belt', supplierCode: 'COS', packQty: 20, replenishment: 'kanban', pointOfUse: 'L1-ST07', usedOn: each(RIDE, 1) },
];

/**
 * One engineering change: from `workingDaysFromStart` working days into the sequence, the model
 * takes the revised vacuum motor; the old line ends the calendar day before.
 */
export const ENGINEERING_CHANGE = {
  parent: FS26W,
  oldComponent: 'VAC-600',
  newComponent: 'VAC-650',
  workingDaysFromStart: 10,
};
