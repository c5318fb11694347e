// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';

// Server-rendered app; @astrojs/node in middleware mode so our own http.Server (scripts/stack/serve.ts)
// owns listening, static files and graceful shutdown.
export default defineConfig({
  output: 'server',
  adapter: node({ mode: 'middleware' }),
  integrations: [react()],
  server: { host: '127.0.0.1', port: 4321 },
  security: { checkOrigin: true },
  vite: {
    plugins: [tailwindcss()],
    ssr: { external: ['@node-rs/argon2', 'mysql2', 'knex', 'nodemailer', 'smtp-server', 'mailparser'] },
  },
});
