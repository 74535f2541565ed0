// The brewing core: pure calculations shared by the phone and the server. Percent values are
// percent (1.30 means 1.30 %), masses are grams.
export * from './brew'
export * from './calibration'
export * from './errors'
export * from './extraction'
export * from './mass'
export * from './ratio'
export * from './readings'
export * from './recipe'
export * from './rounding'
export * from './sucrose'
export * from './uncertainty'
export * from './zones'
