// The sense topologies the picker knows, by name.
import { diffTopology } from './diff.js';
import { directTopology } from './direct.js';
import { noninvTopology } from './noninv.js';
import type { SenseTopology } from './topology.js';
import type { SenseTopologyName } from './types.js';

export const SENSE_TOPOLOGY_MODULES: Record<SenseTopologyName, SenseTopology> = {
  noninv: noninvTopology,
  diff: diffTopology,
  direct: directTopology,
};
