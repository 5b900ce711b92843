// Once the app is interactive, taps reach the buttons themselves (utils/early-tap.ts), on every page.
export default defineNuxtPlugin((nuxtApp) => {
  nuxtApp.hook('app:mounted', () => { (window as { __kerfReady?: boolean }).__kerfReady = true })
})
