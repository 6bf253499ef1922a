/** The physics core of xsred: constants, units, nuclides, kinematics, Rutherford and screening. */
export * from './codata2018.js';
export * from './units.js';
export * from './element-symbols.js';
export * from './natural-abundances.js';
export * from './nuclides.js';
export * from './elastic-kinematic-factor.js';
export * from './two-body-kinematics.js';
export * from './lab-cm.js';
export * from './rutherford-cm.js';
export * from './rutherford-lab.js';
export * from './screening-lecuyer.js';
