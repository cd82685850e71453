import type { Model } from '../core/model/types';
import sleepStress from './sleep-stress.json';
import lake from './lake.json';
import greenhouse from './greenhouse.json';
import warehouse from './warehouse.json';
import eveningUnrest from './evening-unrest.json';

/** An example of the gallery: a scenario of Loopfold's own, with a short description. */
export interface Example {
  id: string;
  title: string;
  summary: string;
  /** Raw model JSON; validate with parseModel before use, like any file. */
  model: unknown;
}

export const EXAMPLES: Example[] = [
  {
    id: 'sleep-stress',
    title: 'Sleep, stress and mood',
    summary: 'An illustrative daily-life loop from minutes (stress) to months (coping). No clinical advice.',
    model: sleepStress,
  },
  {
    id: 'lake',
    title: 'A lake after the runoff',
    summary: 'A workshop sketch of nutrients, algae, grazers and fish, with a sediment store that releases phosphorus back.',
    model: lake,
  },
  {
    id: 'greenhouse',
    title: 'Greenhouse climate',
    summary: 'Heating towards a setpoint, humidity from transpiration, soil water and dust on the glass, with formulas.',
    model: greenhouse,
  },
  {
    id: 'warehouse',
    title: 'Warehouse restocking',
    summary: 'Orders, goods in transit, deliveries and stock, with an implicit transit relation the ordering orients.',
    model: warehouse,
  },
  {
    id: 'evening-unrest',
    title: 'Evening unrest: one loop, two pictures',
    summary: 'Fast worry, tension, irritability and restlessness in a loop, pushed by slow strain that differs between persons; timescales given as ranges. Illustrative, no clinical advice.',
    model: eveningUnrest,
  },
];

export const DEFAULT_EXAMPLE = 'sleep-stress';
export type { Model };
