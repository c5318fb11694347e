/** Mail settings (README "Configuration"); read through the one configuration module. */
import { appConfig, readConfig, DEFAULT_MAIL_FROM, type MailConfig } from '../config.ts';

export { DEFAULT_MAIL_FROM, type MailConfig };

const configOf = (env?: NodeJS.ProcessEnv) => (env ? readConfig(env) : appConfig());

export function mailConfigFromEnv(env?: NodeJS.ProcessEnv): MailConfig {
  return configOf(env).mail;
}

export function mailSinkIsLocal(env?: NodeJS.ProcessEnv): boolean {
  return configOf(env).mail.sinkLocal;
}

/**
 * The address links in e-mail point to. PUBLIC_URL when set; in local mode the address the request came
 * in on. Outside local mode PUBLIC_URL is required, so a forged Host header can never steer a reset link.
 */
export function publicBaseUrl(requestOrigin: string, env?: NodeJS.ProcessEnv): string {
  const config = configOf(env);
  if (config.publicUrl) return config.publicUrl;
  if (config.mail.sinkLocal) return requestOrigin;
  throw new Error('PUBLIC_URL is not set: Stallpoint needs it to put links into e-mail.');
}

/**
 * Links in a notice that must not stop the action it reports (a review decision): PUBLIC_URL when it can be
 * had, else the address the request came in on.
 */
export function noticeBaseUrl(requestOrigin: string, env?: NodeJS.ProcessEnv): string {
  const config = configOf(env);
  return config.publicUrl ?? requestOrigin;
}
