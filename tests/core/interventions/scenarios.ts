/**
 * Scenarios of our own for the intervention tests (invented numbers, for
 * demonstration): a greenhouse whose heater integrates the temperature error
 * (a thermostat-like integral controller), and a warehouse whose orders
 * carry an integral correction for the stock gap.
 */
import type { Model } from '../../../src/core/model/types';

export const greenhouseIntegral: Model = {
  format: 'loopfold-model',
  version: 1,
  name: 'Greenhouse with an integrating heater',
  timeUnit: 'min',
  variables: [
    { id: 'outsideTemp', kind: 'input', value: 5 },
    { id: 'setpoint', kind: 'input', value: 20 },
    { id: 'airTemp', kind: 'state', timescale: '10 min', initial: 20, rate: '(outsideTemp - airTemp) / 10 + 0.05 * heat' },
    { id: 'heat', kind: 'state', timescale: '90 min', initial: 30, rate: '0.02 * (setpoint - airTemp)' },
    { id: 'comfort', kind: 'derived', formula: '1 - abs(airTemp - 21) / 10' },
  ],
  links: [],
};

export const warehouseIntegral: Model = {
  format: 'loopfold-model',
  version: 1,
  name: 'Warehouse with an integral stock correction',
  timeUnit: 'day',
  variables: [
    { id: 'demand', kind: 'input', value: 100 },
    { id: 'target', kind: 'input', value: 500 },
    { id: 'stock', kind: 'state', timescale: '3 day', initial: 500, rate: 'orders - demand' },
    { id: 'correction', kind: 'state', timescale: '10 day', initial: 100, rate: '0.05 * (target - stock)' },
    { id: 'orders', kind: 'derived', formula: '0.4 * (target - stock) + correction' },
  ],
  links: [],
};

/** The same warehouse with a proportional correction only: the stock settles below target when demand rises (no adaptation). */
export const warehouseProportional: Model = {
  ...warehouseIntegral,
  name: 'Warehouse with a proportional stock correction',
  variables: [
    { id: 'demand', kind: 'input', value: 100 },
    { id: 'target', kind: 'input', value: 500 },
    { id: 'stock', kind: 'state', timescale: '3 day', initial: 500, rate: 'orders - demand' },
    { id: 'orders', kind: 'derived', formula: '0.4 * (target - stock) + 100' },
  ],
};
