import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';

const repositoryRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../..');

const bool = z.enum(['true', 'false']).transform((v) => v === 'true');

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  APP_URL: z.url().default('http://127.0.0.1:3000'),
  DATABASE_URL: z.string().min(1, 'DATABASE_URL (the app role) is required'),
  DATABASE_OWNER_URL: z.string().min(1).optional(),
  DATABASE_POOL_MAX: z.coerce.number().int().min(1).default(10),
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must have at least 32 characters'),
  SESSION_IDLE_SECONDS: z.coerce.number().int().min(1).default(60 * 60 * 8),
  SESSION_ABSOLUTE_SECONDS: z.coerce.number().int().min(1).default(60 * 60 * 24 * 7),
  SOCKET_SESSION_CHECK_SECONDS: z.coerce.number().min(0.1).default(60),
  TRUST_PROXY_HOPS: z.coerce.number().int().min(0).default(0),
  SIGNIN_WINDOW_SECONDS: z.coerce.number().int().min(1).default(15 * 60),
  SIGNIN_MAX_PER_IP: z.coerce.number().int().min(1).default(50),
  SIGNIN_MAX_FAILURES_PER_ACCOUNT: z.coerce.number().int().min(1).default(10),
  SIGNIN_MAX_FAILURES_PER_ACCOUNT_ALL_ADDRESSES: z.coerce.number().int().min(1).default(100),
  PASSWORD_RESET_MAX_PER_IP: z.coerce.number().int().min(1).default(20),
  RESET_TOKEN_TTL_MINUTES: z.coerce.number().int().min(1).default(60),
  MEMBER_LINK_TTL_HOURS: z.coerce.number().int().min(1).default(72),
  APPLY_WINDOW_SECONDS: z.coerce.number().int().min(1).default(60 * 60),
  APPLY_MAX_PER_IP: z.coerce.number().int().min(1).default(10),
  APPLY_MAX_PER_EMAIL: z.coerce.number().int().min(1).default(3),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().default(1025),
  SMTP_SECURE: bool.default(false),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  MAIL_FROM: z.string().default('Burrowline <no-reply@burrowline.test>'),
  MAIL_WORKER: bool.default(true),
  MAIL_POLL_SECONDS: z.coerce.number().min(0.5).default(2),
  MAIL_RETRY_DELAY_SECONDS: z.coerce.number().int().min(1).default(5),
  CLIENT_DIST: z.string().optional(),
  UPLOADS_DIR: z.string().min(1).optional(),
  /** Where uploaded files live: this server's disk (one instance) or an S3-compatible object store (several). */
  STORAGE_DRIVER: z.enum(['local', 's3']).default('local'),
  S3_ENDPOINT: z.url().optional(),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_BUCKET: z.string().min(3).optional(),
  S3_ACCESS_KEY_ID: z.string().min(1).optional(),
  S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
  S3_FORCE_PATH_STYLE: bool.default(true),
  /** Live events reach sockets on every app instance (Socket.IO's PostgreSQL adapter) instead of this one only. */
  REALTIME_ACROSS_INSTANCES: bool.default(false),
  PHOTO_MAX_BYTES: z.coerce.number().int().min(1024).default(8 * 1024 * 1024),
  PHOTOS_PER_ANIMAL: z.coerce.number().int().min(1).max(100).default(12),
  PHOTOS_PER_UPLOAD: z.coerce.number().int().min(1).max(20).default(6),
  HERD_IMPORT_MAX_BYTES: z.coerce.number().int().min(1024).default(5 * 1024 * 1024),
  HERD_IMPORT_MAX_ROWS: z.coerce.number().int().min(1).default(20_000),
  HERD_IMPORTS_WAITING_PER_FARM: z.coerce.number().int().min(1).default(10),
  /** The Almanac's morning e-mail job (pg-boss) in this process: off for a process that only serves requests. */
  MORNING_EMAIL_JOBS: bool.default(true),
  /** Card payments (Stripe's API or the local fake): all optional; without a secret key, paying by card is off. */
  STRIPE_SECRET_KEY: z.string().startsWith('sk_', 'STRIPE_SECRET_KEY starts with sk_').optional(),
  STRIPE_WEBHOOK_SECRET: z.string().startsWith('whsec_', 'STRIPE_WEBHOOK_SECRET starts with whsec_').optional(),
  STRIPE_API_HOST: z.string().min(1).optional(),
  STRIPE_API_PORT: z.coerce.number().int().min(1).max(65535).optional(),
  STRIPE_API_PROTOCOL: z.enum(['http', 'https']).optional(),
  CHAT_RATE_MESSAGES: z.coerce.number().int().min(1).default(20),
  CHAT_RATE_WINDOW_SECONDS: z.coerce.number().int().min(1).default(10),
  LOG_LEVEL: z.enum(['debug', 'info', 'warn', 'error', 'silent']).default('info'),
}).refine((e) => !e.STRIPE_SECRET_KEY || e.STRIPE_WEBHOOK_SECRET, { path: ['STRIPE_WEBHOOK_SECRET'], message: 'STRIPE_WEBHOOK_SECRET is required with STRIPE_SECRET_KEY' })
  .refine((e) => e.STORAGE_DRIVER !== 's3' || e.S3_BUCKET, { path: ['S3_BUCKET'], message: 'S3_BUCKET is required with STORAGE_DRIVER=s3' })
  .refine((e) => !e.S3_ACCESS_KEY_ID === !e.S3_SECRET_ACCESS_KEY, { path: ['S3_SECRET_ACCESS_KEY'], message: 'S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY go together' });

export type Env = z.infer<typeof envSchema>;

export interface Config {
  env: Env['NODE_ENV'];
  host: string;
  port: number;
  appUrl: string;
  databaseUrl: string;
  databaseOwnerUrl: string | undefined;
  databasePoolMax: number;
  sessionSecret: string;
  sessionIdleSeconds: number;
  sessionAbsoluteSeconds: number;
  trustProxyHops: number;
  socketSessionCheckSeconds: number;
  /**
   * Sign-in limits: every attempt per address; failed attempts per account from one address; and failed
   * attempts per account from all addresses together, which addresses the account signed in from before skip.
   */
  signIn: { windowSeconds: number; maxPerIp: number; maxFailuresPerAccount: number; maxFailuresPerAccountAllAddresses: number; maxResetsPerIp: number };
  resetTokenTtlMinutes: number;
  /**
   * Welcome links (approved applicants, invitations) live longer than reset links: people open them
   * days later. The public application form is limited per address and per e-mail.
   */
  membership: { linkTtlHours: number; applyWindowSeconds: number; applyMaxPerIp: number; applyMaxPerEmail: number };
  smtp: { host: string; port: number; secure: boolean; user?: string; pass?: string; from: string };
  /**
   * Queued e-mail (the outbox): deliver it from this process, how often an idle worker looks for new
   * mail, and the first retry delay after the mail server refused or was down (doubling each try).
   */
  mail: { worker: boolean; pollingIntervalSeconds: number; retryDelaySeconds: number };
  clientDist: string | undefined;
  /**
   * Uploaded files (photos) are kept here, outside the web root; the default is the gitignored
   * `.data/uploads` of the repository. Limits: bytes per photo, photos per animal and per upload,
   * bytes and rows per herd spreadsheet.
   */
  uploads: { dir: string; photoMaxBytes: number; photosPerAnimal: number; photosPerUpload: number; importMaxBytes: number; importMaxRows: number; importsWaitingPerFarm: number };
  /** The S3-compatible object store when `STORAGE_DRIVER=s3`; null keeps files under `uploads.dir`. */
  objectStore: ObjectStoreConfig | null;
  /** Carry live events to the other app instances through PostgreSQL (LISTEN/NOTIFY). */
  realtimeAcrossInstances: boolean;
  /** Run the Almanac's morning e-mail schedule and worker in this process (server.ts). */
  morningEmailJobs: boolean;
  /**
   * Card payments: the card service's secret key and webhook signing secret, and where its API answers
   * (the real service when host, port and protocol are left out). Null when no key is set.
   */
  card: CardConfig | null;
  /** Co-op Chat: at most `messages` per person in `windowSeconds` (a flood, a stuck client). */
  chat: { rateLimit: { messages: number; windowSeconds: number } };
  logLevel: Env['LOG_LEVEL'];
}

export interface ObjectStoreConfig {
  /** Left out for Amazon S3 itself; any S3-compatible service's address otherwise. */
  endpoint?: string;
  region: string;
  bucket: string;
  /** Left out to use the SDK's own chain (AWS_* variables, an instance role). */
  credentials?: { accessKeyId: string; secretAccessKey: string };
  forcePathStyle: boolean;
}

export interface CardConfig {
  secretKey: string;
  webhookSecret: string;
  apiHost?: string;
  apiPort?: number;
  apiProtocol?: 'http' | 'https';
}

/** Parses the environment once at boot and fails fast with a message naming each bad variable. */
export function loadConfig(source: NodeJS.ProcessEnv = process.env): Config {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  return {
    env: e.NODE_ENV,
    host: e.HOST,
    port: e.PORT,
    appUrl: e.APP_URL.replace(/\/$/, ''),
    databaseUrl: e.DATABASE_URL,
    databaseOwnerUrl: e.DATABASE_OWNER_URL,
    databasePoolMax: e.DATABASE_POOL_MAX,
    sessionSecret: e.SESSION_SECRET,
    sessionIdleSeconds: e.SESSION_IDLE_SECONDS,
    sessionAbsoluteSeconds: e.SESSION_ABSOLUTE_SECONDS,
    trustProxyHops: e.TRUST_PROXY_HOPS,
    socketSessionCheckSeconds: e.SOCKET_SESSION_CHECK_SECONDS,
    signIn: {
      windowSeconds: e.SIGNIN_WINDOW_SECONDS,
      maxPerIp: e.SIGNIN_MAX_PER_IP,
      maxFailuresPerAccount: e.SIGNIN_MAX_FAILURES_PER_ACCOUNT,
      maxFailuresPerAccountAllAddresses: e.SIGNIN_MAX_FAILURES_PER_ACCOUNT_ALL_ADDRESSES,
      maxResetsPerIp: e.PASSWORD_RESET_MAX_PER_IP,
    },
    resetTokenTtlMinutes: e.RESET_TOKEN_TTL_MINUTES,
    membership: {
      linkTtlHours: e.MEMBER_LINK_TTL_HOURS,
      applyWindowSeconds: e.APPLY_WINDOW_SECONDS,
      applyMaxPerIp: e.APPLY_MAX_PER_IP,
      applyMaxPerEmail: e.APPLY_MAX_PER_EMAIL,
    },
    smtp: { host: e.SMTP_HOST, port: e.SMTP_PORT, secure: e.SMTP_SECURE, user: e.SMTP_USER, pass: e.SMTP_PASS, from: e.MAIL_FROM },
    mail: { worker: e.MAIL_WORKER, pollingIntervalSeconds: e.MAIL_POLL_SECONDS, retryDelaySeconds: e.MAIL_RETRY_DELAY_SECONDS },
    clientDist: e.CLIENT_DIST,
    uploads: {
      dir: path.resolve(repositoryRoot, e.UPLOADS_DIR ?? '.data/uploads'),
      photoMaxBytes: e.PHOTO_MAX_BYTES,
      photosPerAnimal: e.PHOTOS_PER_ANIMAL,
      photosPerUpload: e.PHOTOS_PER_UPLOAD,
      importMaxBytes: e.HERD_IMPORT_MAX_BYTES,
      importMaxRows: e.HERD_IMPORT_MAX_ROWS,
      importsWaitingPerFarm: e.HERD_IMPORTS_WAITING_PER_FARM,
    },
    objectStore:
      e.STORAGE_DRIVER === 's3'
        ? {
            endpoint: e.S3_ENDPOINT,
            region: e.S3_REGION,
            bucket: e.S3_BUCKET!,
            credentials: e.S3_ACCESS_KEY_ID ? { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY! } : undefined,
            forcePathStyle: e.S3_FORCE_PATH_STYLE,
          }
        : null,
    realtimeAcrossInstances: e.REALTIME_ACROSS_INSTANCES,
    morningEmailJobs: e.MORNING_EMAIL_JOBS,
    card: e.STRIPE_SECRET_KEY
      ? { secretKey: e.STRIPE_SECRET_KEY, webhookSecret: e.STRIPE_WEBHOOK_SECRET!, apiHost: e.STRIPE_API_HOST, apiPort: e.STRIPE_API_PORT, apiProtocol: e.STRIPE_API_PROTOCOL }
      : null,
    chat: { rateLimit: { messages: e.CHAT_RATE_MESSAGES, windowSeconds: e.CHAT_RATE_WINDOW_SECONDS } },
    logLevel: e.LOG_LEVEL,
  };
}
