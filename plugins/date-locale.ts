// The reader's locale for dates (utils/format-dates.ts), decided once per visit:
// on the server from Accept-Language, in the browser from the payload (so hydration
// agrees), and from navigator.language when the page was never rendered on a server.
export default defineNuxtPlugin(() => {
  const locale = useState<string>('date-locale', () =>
    pickDateLocale(import.meta.server ? useRequestHeaders(['accept-language'])['accept-language'] : navigator.language),
  )
  return { provide: { dateLocale: locale.value } }
})
