/**
 * The first element of every feature's query keys; each feature builds the rest in its `api/keys.ts`. A write that
 * changes what another feature shows (a renamed site, imported units) invalidates that feature's root from here, so
 * no feature reaches into another's key factory.
 */
export const queryRoots = {
  account: ['account'],
  alerts: ['alerts'],
  cylinders: ['cylinders'],
  decisions: ['decisions'],
  fleet: ['fleet'],
  history: ['history'],
  imports: ['imports'],
  jobs: ['jobs'],
  mail: ['mail'],
  people: ['people'],
  refrigerantLog: ['refrigerant-log'],
  settings: ['settings'],
  sites: ['sites'],
  trace: ['trace'],
  units: ['units'],
} as const;
