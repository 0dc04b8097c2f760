// @ts-check
import { defineConfig } from 'astro/config';
import node from '@astrojs/node';
import react from '@astrojs/react';
import tailwindcss from '@tailwindcss/vite';

export default defineConfig({
  output: 'server',
  // `npm test` builds into its own throwaway folder so parallel runs never replace a running build.
  outDir: process.env.TT_OUT_DIR ?? './dist',
  adapter: node({ mode: 'standalone' }),
  integrations: [react()],
  server: { host: process.env.HOST ?? '127.0.0.1', port: Number(process.env.PORT ?? 4321) },
  // The built server compares Origin against its own host; list the loopback names so
  // form POSTs from either spelling are accepted (see DEVELOPERS.md).
  security: {
    checkOrigin: true,
    allowedDomains: [{ hostname: '127.0.0.1' }, { hostname: 'localhost' }],
  },
  vite: {
    plugins: [tailwindcss()],
    build: {
      rollupOptions: {
        // Domain modules are pure by rule (no I/O, nothing done on import), so a module none of
        // whose exports are used is dropped: the runner imports the run barrel without pulling
        // the event schema — and with it the schema library — into the browser.
        treeshake: { moduleSideEffects: (id, external) => external || !/[\\/]src[\\/]domain[\\/]/.test(id) },
      },
    },
    ssr: { external: ['pg-boss', 'pg', '@mikro-orm/core', '@mikro-orm/postgresql', '@mikro-orm/migrations', '@mikro-orm/seeder', 'nodemailer', 'qrcode', 'pdf-lib'] },
  },
});
