/** Energy loss of light ions in layers: slowing down, the inverse, mid-depth energy, straggling, spread across a layer. */
export * from './bohr-straggling.js';
export * from './slow-down-with.js';
export * from './slow-down.js';
export * from './energy-at-mid-depth.js';
export * from './layer-energy-spread.js';
export * from './path-for-energy-loss.js';
