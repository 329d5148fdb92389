// Types for scripts/db.mjs, which stays plain JavaScript so it runs before `npm ci`.
export interface Cluster {
  dataDir: string
  port: number
}
export interface ClusterStatus {
  running: boolean
  initialised: boolean
  port?: number
}
export declare const ROOT: string
export declare const DEFAULT_PORT: number
export declare const APP_DB: string
export declare class DbScriptError extends Error {}
export declare function defaultCluster(): Cluster
export declare function databaseUrl(name?: string, cluster?: Cluster): string
export declare function ensureInstalled(): void
export declare function removeStalePidFile(dataDir: string): boolean
export declare function status(cluster?: Cluster): ClusterStatus
export interface StartOptions {
  quiet?: boolean
  database?: string | null
  /** 'serve' makes the cluster durable and password-protected; 'test' (default) may make a fast new one. */
  profile?: 'serve' | 'test'
}
export declare function start(cluster?: Cluster, opts?: StartOptions): Promise<{ url: string }>
export declare function passwordFile(cluster?: Cluster): string
export declare function stop(cluster?: Cluster, opts?: { quiet?: boolean }): boolean
export declare function databaseExists(name: string, cluster?: Cluster): boolean
export declare function createDb(name: string, cluster?: Cluster): boolean
export declare function dropDb(name: string, cluster?: Cluster): void
export declare function testDatabaseName(): string
export declare function listDatabases(cluster?: Cluster): string[]
