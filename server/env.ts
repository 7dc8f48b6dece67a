import { resolve } from 'node:path';
import { isIP } from 'node:net';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';

/**
 * The only reader of process.env. Everything the server needs from its
 * environment is validated here and handed around as a typed object.
 */
const schema = z
  .object({
    NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
    PORT: z.coerce.number().int().min(0).max(65535).default(3000),
    HOST: z.string().min(1).default('127.0.0.1'),
    APP_URL: z.url().optional(),
    DATABASE_URL: z.string().min(1).default('postgres://postgres@127.0.0.1:54329/tenthmark'),
    TENTHMARK_PG_PORT: z.coerce.number().int().min(1).max(65535).default(54329),
    /** `npm start` only: the folder of the private cluster and the payment stand-in's state (default .data/). */
    TENTHMARK_DATA_DIR: z.string().min(1).optional(),
    /** `npm start` only: serve this existing production build instead of building into dist/client. */
    TENTHMARK_CLIENT_DIR: z.string().min(1).optional(),
    /** `npm start` only: build the demo jobs on an empty database (about a minute). */
    TENTHMARK_DEMO: z.stringbool().default(true),
    SESSION_SECRET: z.string().min(16).optional(),
    UPLOADS_DIR: z.string().min(1).optional(),
    /** Where uploaded photos live: the uploads folder on this machine (disk), or an S3-compatible object store that every instance shares (s3). */
    STORAGE: z.enum(['disk', 's3']).default('disk'),
    /** The object store's address; unset means Amazon S3 itself in S3_REGION. */
    S3_ENDPOINT: z.url().optional(),
    S3_BUCKET: z.string().min(1).optional(),
    S3_REGION: z.string().min(1).default('us-east-1'),
    S3_ACCESS_KEY_ID: z.string().min(1).optional(),
    S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
    /** Address the bucket in the path (endpoint/bucket/key), as most self-hosted stores expect; false for bucket.endpoint names. */
    S3_PATH_STYLE: z.stringbool().default(true),
    LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
    /** Hold each JSON answer to its route's declared schema: strict (a 500), log, or off. Default: strict in tests, log in development, off in production. */
    RESPONSE_CHECK: z.enum(['off', 'log', 'strict']).optional(),
    /**
     * Which proxies in front of the app may say who the client is (X-Forwarded-For, -Proto):
     * unset or "false" trusts none; a number of hops; or comma-separated addresses, subnets
     * and the names Express knows (loopback, linklocal, uniquelocal).
     */
    TRUST_PROXY: z
      .string()
      .trim()
      .default('')
      .transform((value, ctx): TrustProxy => {
        if (value === '' || value === 'false' || value === 'none') return false;
        if (value === 'true') return true;
        if (/^\d+$/.test(value)) return Number(value);
        const entries = value.split(',').map((entry) => entry.trim()).filter(Boolean);
        for (const entry of entries) {
          if (!isTrustEntry(entry)) {
            ctx.addIssue({ code: 'custom', message: `"${entry}" is not an address, a subnet, a number of hops or one of loopback, linklocal, uniquelocal` });
            return z.NEVER;
          }
        }
        return entries;
      }),

    SMTP_HOST: z.string().default('127.0.0.1'),
    SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(1025),
    SMTP_SECURE: z.stringbool().default(false),
    SMTP_USER: z.string().optional(),
    SMTP_PASSWORD: z.string().optional(),
    MAIL_FROM: z.string().default('Tenthmark <no-reply@tenthmark.test>'),
    /** The address that reaches Tenthmark's people (the mail sender takes no replies): named on the help page and in mail about an account. */
    SUPPORT_EMAIL: z.email('must be an e-mail address').default('help@tenthmark.test'),
    MAILDEV_WEB_PORT: z.coerce.number().int().min(1).max(65535).default(1080),

    GITHUB_CLIENT_ID: z.string().optional(),
    GITHUB_CLIENT_SECRET: z.string().optional(),
    GITHUB_STAND_IN_PORT: z.coerce.number().int().min(1).max(65535).default(3101),
    GITHUB_STAND_IN_URL: z.url().optional(),

    STRIPE_SECRET_KEY: z.string().startsWith('sk_', 'must be a secret key (sk_…)').default('sk_test_tenthmark_local'),
    STRIPE_WEBHOOK_SECRET: z.string().startsWith('whsec_', 'must be a webhook secret (whsec_…)').default('whsec_tenthmark_local_signing_secret'),
    /** Where the payment API is; unset with a real key means the provider itself. */
    STRIPE_API_URL: z.url().optional(),
    PAYMENTS_STAND_IN_PORT: z.coerce.number().int().min(1).max(65535).default(12111),
    PLATFORM_FEE_BPS: z.coerce.number().int().min(0).max(5000).default(800),
    REVIEW_WINDOW_DAYS: z.coerce.number().positive().max(60).default(5),

    RATE_LIMIT_SIGNIN_MAX: z.coerce.number().int().positive().default(10),
    RATE_LIMIT_SIGNUP_MAX: z.coerce.number().int().positive().default(20),
    RATE_LIMIT_CALCULATIONS_PER_MINUTE: z.coerce.number().int().positive().default(120),
    RATE_LIMIT_MESSAGES_PER_10S: z.coerce.number().int().positive().default(20),
    /** Photo uploads (job, conversation and milestone photos together) one person may make in ten minutes. */
    RATE_LIMIT_UPLOADS_PER_10_MIN: z.coerce.number().int().positive().default(60),
    /** Password-reset requests from one address in an hour (each account also has its own limit of 5). */
    RATE_LIMIT_RESET_PER_ADDRESS: z.coerce.number().int().positive().default(20),
  })
  .superRefine((value, ctx) => {
    if (value.NODE_ENV === 'production' && !value.SESSION_SECRET) {
      ctx.addIssue({ code: 'custom', path: ['SESSION_SECRET'], message: 'is required in production (16+ characters)' });
    }
    if (value.STORAGE === 's3') {
      for (const name of ['S3_BUCKET', 'S3_ACCESS_KEY_ID', 'S3_SECRET_ACCESS_KEY'] as const) {
        if (!value[name]) ctx.addIssue({ code: 'custom', path: [name], message: 'is required when STORAGE=s3' });
      }
    }
    if (Boolean(value.GITHUB_CLIENT_ID) !== Boolean(value.GITHUB_CLIENT_SECRET)) {
      ctx.addIssue({
        code: 'custom',
        path: ['GITHUB_CLIENT_SECRET'],
        message: 'GITHUB_CLIENT_ID and GITHUB_CLIENT_SECRET go together',
      });
    }
  });

export type RawEnv = z.infer<typeof schema>;

/** Express's 'trust proxy': false (none), true (any), a number of hops, or addresses, subnets and named ranges. */
export type TrustProxy = boolean | number | string[];

function isTrustEntry(entry: string): boolean {
  if (['loopback', 'linklocal', 'uniquelocal'].includes(entry)) return true;
  const [address, bits, extra] = entry.split('/');
  if (extra !== undefined || !isIP(address)) return false;
  if (bits === undefined) return true;
  if (isIP(bits)) return true; // a netmask, like 255.255.255.0
  const max = isIP(address) === 4 ? 32 : 128;
  return /^\d+$/.test(bits) && Number(bits) <= max;
}

export interface GithubConfig {
  clientId: string;
  clientSecret: string;
  authorizationURL: string;
  tokenURL: string;
  userProfileURL: string;
  userEmailURL: string;
  /** True when pointed at the local stand-in instead of GitHub. */
  standIn: boolean;
}

/** Where uploaded files live (server/lib/storage.ts). */
export type StorageConfig =
  | { kind: 'disk'; dir: string }
  | { kind: 's3'; endpoint?: string; bucket: string; region: string; accessKeyId: string; secretAccessKey: string; pathStyle: boolean };

export interface AppConfig {
  nodeEnv: RawEnv['NODE_ENV'];
  port: number;
  host: string;
  appUrl: string;
  databaseUrl: string;
  pgPort: number;
  /** `npm start`: where the private cluster lives. */
  dataDir: string;
  /** `npm start`: an existing build to serve instead of building one. */
  clientDir?: string;
  /** `npm start`: build the demo jobs on an empty database. */
  demoScenario: boolean;
  sessionSecret: string;
  logLevel: RawEnv['LOG_LEVEL'];
  /** Whether answers are held to their declared schemas (server/lib/http/routes.ts). */
  responseCheck: 'off' | 'log' | 'strict';
  /** Express's 'trust proxy' setting; false unless TRUST_PROXY names the proxies. */
  trustProxy: TrustProxy;
  uploadsDir: string;
  /** The uploads folder (uploadsDir) or the object store the settings name. */
  storage: StorageConfig;
  smtp: { host: string; port: number; secure: boolean; user?: string; password?: string };
  mailFrom: string;
  /** Where people write to reach us (SUPPORT_EMAIL). */
  supportEmail: string;
  maildevWebPort: number;
  github: GithubConfig;
  githubStandInPort: number;
  payments: {
    secretKey: string;
    webhookSecret: string;
    /** Set when talking to a local stand-in instead of the provider. */
    apiUrl?: string;
    standInPort: number;
    platformFeeBps: number;
  };
  /** Days a builder has to answer an inspection record before it counts as accepted. */
  reviewWindowDays: number;
  rateLimits: { signInMax: number; signUpMax: number; calculationsPerMinute: number; messagesPer10s: number; uploadsPer10Min: number; resetPerAddress: number };
}

export function loadConfig(source: NodeJS.ProcessEnv = process.env): AppConfig {
  const parsed = schema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${issue.path.join('.') || '(env)'}: ${issue.message}`);
    throw new Error(`The environment is not valid:\n${lines.join('\n')}`);
  }
  const env = parsed.data;
  const appUrl = (env.APP_URL ?? defaultAppUrl(env.HOST, env.PORT)).replace(/\/$/, '');
  const uploadsDir = env.UPLOADS_DIR ?? fileURLToPath(new URL('../uploads', import.meta.url));
  const realGithub = Boolean(env.GITHUB_CLIENT_ID && env.GITHUB_CLIENT_SECRET);
  const standInUrl = (env.GITHUB_STAND_IN_URL ?? `http://127.0.0.1:${env.GITHUB_STAND_IN_PORT}`).replace(/\/$/, '');
  const github: GithubConfig = realGithub
    ? {
        clientId: env.GITHUB_CLIENT_ID!,
        clientSecret: env.GITHUB_CLIENT_SECRET!,
        authorizationURL: 'https://github.com/login/oauth/authorize',
        tokenURL: 'https://github.com/login/oauth/access_token',
        userProfileURL: 'https://api.github.com/user',
        userEmailURL: 'https://api.github.com/user/emails',
        standIn: false,
      }
    : {
        clientId: 'tenthmark-local',
        clientSecret: 'tenthmark-local-secret',
        authorizationURL: `${standInUrl}/login/oauth/authorize`,
        tokenURL: `${standInUrl}/login/oauth/access_token`,
        userProfileURL: `${standInUrl}/user`,
        userEmailURL: `${standInUrl}/user/emails`,
        standIn: true,
      };
  return {
    nodeEnv: env.NODE_ENV,
    port: env.PORT,
    host: env.HOST,
    appUrl,
    databaseUrl: env.DATABASE_URL,
    pgPort: env.TENTHMARK_PG_PORT,
    dataDir: resolve(env.TENTHMARK_DATA_DIR ?? fileURLToPath(new URL('../.data', import.meta.url))),
    clientDir: env.TENTHMARK_CLIENT_DIR ? resolve(env.TENTHMARK_CLIENT_DIR) : undefined,
    demoScenario: env.TENTHMARK_DEMO,
    sessionSecret: env.SESSION_SECRET ?? 'tenthmark-local-development-secret',
    logLevel: env.LOG_LEVEL,
    responseCheck: env.RESPONSE_CHECK ?? ({ test: 'strict', development: 'log', production: 'off' } as const)[env.NODE_ENV],
    trustProxy: env.TRUST_PROXY,
    uploadsDir,
    storage:
      env.STORAGE === 's3'
        ? {
            kind: 's3',
            endpoint: env.S3_ENDPOINT,
            bucket: env.S3_BUCKET!,
            region: env.S3_REGION,
            accessKeyId: env.S3_ACCESS_KEY_ID!,
            secretAccessKey: env.S3_SECRET_ACCESS_KEY!,
            pathStyle: env.S3_PATH_STYLE,
          }
        : { kind: 'disk', dir: uploadsDir },
    smtp: {
      host: env.SMTP_HOST,
      port: env.SMTP_PORT,
      secure: env.SMTP_SECURE,
      user: env.SMTP_USER,
      password: env.SMTP_PASSWORD,
    },
    mailFrom: env.MAIL_FROM,
    supportEmail: env.SUPPORT_EMAIL,
    maildevWebPort: env.MAILDEV_WEB_PORT,
    github,
    githubStandInPort: env.GITHUB_STAND_IN_PORT,
    reviewWindowDays: env.REVIEW_WINDOW_DAYS,
    payments: {
      secretKey: env.STRIPE_SECRET_KEY,
      webhookSecret: env.STRIPE_WEBHOOK_SECRET,
      apiUrl: env.STRIPE_API_URL ?? (env.STRIPE_SECRET_KEY === 'sk_test_tenthmark_local' ? `http://127.0.0.1:${env.PAYMENTS_STAND_IN_PORT}` : undefined),
      standInPort: env.PAYMENTS_STAND_IN_PORT,
      platformFeeBps: env.PLATFORM_FEE_BPS,
    },
    rateLimits: {
      signInMax: env.RATE_LIMIT_SIGNIN_MAX,
      signUpMax: env.RATE_LIMIT_SIGNUP_MAX,
      calculationsPerMinute: env.RATE_LIMIT_CALCULATIONS_PER_MINUTE,
      messagesPer10s: env.RATE_LIMIT_MESSAGES_PER_10S,
      uploadsPer10Min: env.RATE_LIMIT_UPLOADS_PER_10_MIN,
      resetPerAddress: env.RATE_LIMIT_RESET_PER_ADDRESS,
    },
  };
}

const LOOPBACK = new Set(['localhost', '127.0.0.1', '[::1]', '::1']);
const EVERY_ADDRESS = new Set(['0.0.0.0', '::', '[::]']);

/**
 * APP_URL when it is not set: the host and port the app listens on, so e-mail
 * links and payment return pages open the host the person browses (the
 * session cookie is kept per host name). When the app listens on every
 * address there is no one host to name, so it says `localhost`.
 */
export function defaultAppUrl(listenHost: string, port: number): string {
  const host = listenHost.toLowerCase();
  if (EVERY_ADDRESS.has(host)) return `http://localhost:${port}`;
  const bare = host.replace(/^\[(.*)\]$/, '$1');
  return `http://${bare.includes(':') ? `[${bare}]` : bare}:${port}`;
}

/**
 * A warning for the server log when the links Tenthmark sends (APP_URL: e-mail
 * links, payment return pages) name another local host than the one the app
 * listens on, e.g. `localhost` against `127.0.0.1`. The browser keeps the
 * session cookie per host name, so such a link lands the person signed out.
 * Nothing is said for a public name (a proxy in front) or when the app
 * listens on every address.
 */
export function appUrlHostWarning(appUrl: string, listenHost: string): string | undefined {
  const linkHost = new URL(appUrl).hostname.toLowerCase();
  const host = listenHost.toLowerCase();
  if (EVERY_ADDRESS.has(host) || !LOOPBACK.has(linkHost) || linkHost === host || linkHost === `[${host}]`) return undefined;
  return `APP_URL (${appUrl}) names the host ${linkHost}, but the app listens on ${listenHost}: links in e-mails and from the payment pages will open a host where the person is not signed in. Set APP_URL to use ${listenHost}, or HOST to ${linkHost}.`;
}
