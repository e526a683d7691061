// What crosses to a worker thread: plain JSON from which the worker rebuilds the same Model.
import type { Model } from './model.js';
import { buildSupplyModel, type SupplySpec } from './models/supply.js';

export type ModelSource = { kind: 'supply'; spec: SupplySpec };

export function buildFromSource(source: ModelSource): Model {
  switch (source.kind) {
    case 'supply':
      return buildSupplyModel(source.spec);
  }
}
