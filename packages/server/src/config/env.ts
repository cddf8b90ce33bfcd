import { z } from 'zod';

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
  PASSWORD_RESET_MAX_PER_IP: z.coerce.number().int().min(1).default(20),
  RESET_TOKEN_TTL_MINUTES: z.coerce.number().int().min(1).default(60),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().default(1025),
  SMTP_SECURE: bool.default(false),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  MAIL_FROM: z.string().default('Burrowline <no-reply@burrowline.test>'),
  CLIENT_DIST: z.string().optional(),
  LOG_LEVEL: z.enum(['debug', 'info', 'warn', 'error', 'silent']).default('info'),
});

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
  signIn: { windowSeconds: number; maxPerIp: number; maxFailuresPerAccount: number; maxResetsPerIp: number };
  resetTokenTtlMinutes: number;
  smtp: { host: string; port: number; secure: boolean; user?: string; pass?: string; from: string };
  clientDist: string | undefined;
  logLevel: Env['LOG_LEVEL'];
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
      maxResetsPerIp: e.PASSWORD_RESET_MAX_PER_IP,
    },
    resetTokenTtlMinutes: e.RESET_TOKEN_TTL_MINUTES,
    smtp: { host: e.SMTP_HOST, port: e.SMTP_PORT, secure: e.SMTP_SECURE, user: e.SMTP_USER, pass: e.SMTP_PASS, from: e.MAIL_FROM },
    clientDist: e.CLIENT_DIST,
    logLevel: e.LOG_LEVEL,
  };
}
