// Marks <html data-hydrated> once the app has hydrated and its handlers are live.
// The end-to-end helpers wait for it before they type or click (tests/e2e/helpers.ts):
// a click on server-rendered markup before then meets a button with no handler yet.
export default defineNuxtPlugin(() => {
  onNuxtReady(() => {
    document.documentElement.dataset.hydrated = 'true'
  })
})
