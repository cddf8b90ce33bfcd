// Types of the plain-Node bootstrap, for the TypeScript tests that start their own cluster.
export const root: string;
export interface LocalCluster {
  ownerUrl: string;
  appUrl: string;
  stop(): Promise<void>;
}
export function startCluster(options: { name: string; port: number; fresh?: boolean; fast?: boolean }): Promise<LocalCluster>;
export function postgresBinDir(): string;
export function runTs(entry: string, args?: string[], env?: Record<string, string>): void;
export function isPortOpen(port: number, host?: string): Promise<boolean>;
export function waitForHttp(url: string, what: string, timeoutMs?: number): Promise<void>;
export function startFakeCardService(options: { port: number; accounts?: { apiKey: string; webhookSecret: string; webhookUrl: string }[] }): Promise<void>;
export function fakeCardEnv(port: number, webhookSecret?: string): Record<string, string>;
export function startFakeS3(options: { port: number; dir: string; bucket?: string }): Promise<void>;
export function fakeS3Env(port: number, bucket?: string): Record<string, string>;
export function startRoundRobinProxy(options: { port: number; upstreams: number[] }): Promise<void>;
export function stopChildren(): Promise<void>;
