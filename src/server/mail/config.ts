/** Mail settings from the environment (README "Configuration"). */
export interface MailConfig {
  host: string;
  port: number;
  /** TLS from the first byte (port 465); otherwise STARTTLS when the server offers it. */
  secure: boolean;
  user: string | null;
  password: string | null;
  from: string;
  /** MAIL_SINK=local: the local SMTP sink catches everything and admins can read it on /mail. */
  sinkLocal: boolean;
}

export const DEFAULT_MAIL_FROM = 'Stallpoint <no-reply@stallpoint.invalid>';

export function mailConfigFromEnv(env: NodeJS.ProcessEnv = process.env): MailConfig {
  return {
    host: env.SMTP_HOST ?? '127.0.0.1',
    port: Number(env.SMTP_PORT ?? 2526),
    secure: env.SMTP_SECURE === 'true',
    user: env.SMTP_USER || null,
    password: env.SMTP_PASSWORD || null,
    from: env.MAIL_FROM || DEFAULT_MAIL_FROM,
    sinkLocal: env.MAIL_SINK === 'local',
  };
}

export function mailSinkIsLocal(env: NodeJS.ProcessEnv = process.env): boolean {
  return env.MAIL_SINK === 'local';
}

/**
 * The address links in e-mail point to. PUBLIC_URL when set; in local mode the address the request came
 * in on. Outside local mode PUBLIC_URL is required, so a forged Host header can never steer a reset link.
 */
export function publicBaseUrl(requestOrigin: string, env: NodeJS.ProcessEnv = process.env): string {
  if (env.PUBLIC_URL) return env.PUBLIC_URL.replace(/\/+$/, '');
  if (mailSinkIsLocal(env)) return requestOrigin;
  throw new Error('PUBLIC_URL is not set: Stallpoint needs it to put links into e-mail.');
}
