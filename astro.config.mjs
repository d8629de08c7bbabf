// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwind from '@astrojs/tailwind';

/**
 * Roundsmith runs as one standalone Node server (output 'server'). allowedDomains makes Astro trust
 * the Host header for these names; without it the origin check rejects every same-origin form POST.
 */
export default defineConfig({
  output: 'server',
  outDir: process.env.ASTRO_OUT_DIR ?? './dist',
  adapter: node({ mode: 'standalone' }),
  integrations: [react(), tailwind({ applyBaseStyles: false })],
  // The origin check for form posts is done in src/middleware.ts instead, so that the text provider's
  // webhook (a cross-site form post, signed by the provider) can be exempted from it.
  security: {
    checkOrigin: false,
    allowedDomains: [{ hostname: '127.0.0.1' }, { hostname: 'localhost' }],
  },
  server: { host: '127.0.0.1', port: Number(process.env.PORT ?? 4321) },
  vite: {
    ssr: { external: ['@node-rs/argon2', 'sharp', 'mysql2', 'knex', 'twilio', 'nodemailer', 'smtp-server'] },
    build: { chunkSizeWarningLimit: 1600 },
  },
});
