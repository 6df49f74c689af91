// Cyclodial — Nuxt configuration. Source folders live at the repository root
// (architecture.md), so srcDir is the root and Nuxt's shared/ dir sits beside it.
export default defineNuxtConfig({
  compatibilityDate: '2025-07-15',
  srcDir: '.',
  dir: { app: '.' },
  modules: ['@pinia/nuxt', '@nuxtjs/tailwindcss', 'nuxt-auth-utils'],
  devtools: { enabled: false },
  telemetry: false,
  typescript: { strict: true },
  css: ['~/assets/css/main.css'],
  app: {
    head: {
      htmlAttrs: { lang: 'en-GB' },
      title: 'Cyclodial',
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1' },
        { name: 'description', content: 'Practise measuring and recording cyclotorsion with the double Maddox rod test.' },
      ],
    },
  },
  runtimeConfig: {
    dbPath: '.data/cyclodial.sqlite',
    seedDemo: '',
    mailCatcher: '',
    mailCatcherPort: '',
    smtpUrl: '',
    mailFrom: 'Cyclodial <no-reply@cyclodial.test>',
    public: {
      siteUrl: 'http://localhost:3000',
    },
  },
  tailwindcss: { configPath: 'tailwind.config.ts', cssPath: false },
  vite: {
    optimizeDeps: {
      include: ['seedrandom', 'chart.js', 'vue-chartjs', '@vueuse/gesture', '@vueuse/core', 'zod'],
    },
  },
  nitro: {
    experimental: { tasks: true },
  },
})
