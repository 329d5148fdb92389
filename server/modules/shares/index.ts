// The share service's public door for other modules.
export { registerShareable, type Shareable } from './share-registry'
export { resolveShare } from './shares.service'
export { requireResourceAccess, shareTokenOf, type SharedResource } from './share-access'
