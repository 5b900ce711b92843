// Taps that land before the page is interactive. The server-rendered cutter page shows its buttons
// a second or more before the phone has run the code behind them; a small script in the page's
// head (EARLY_TAP_SCRIPT, set in nuxt.config.ts) keeps the last tap on an element marked
// `data-early="<action>"` until then, and the page does it once it is ready, so no tap is lost.

/** Runs in the page head before any other script: plain ES5, no imports. */
export const EARLY_TAP_SCRIPT = `(function(){var w=window;w.__kerfEarly=null;document.addEventListener('click',function(e){
if(w.__kerfReady)return;var t=e.target,b=t&&t.closest?t.closest('[data-early]'):null;if(!b)return;
e.preventDefault();e.stopPropagation();w.__kerfEarly=b.getAttribute('data-early');b.setAttribute('aria-busy','true')},true)})()`

interface EarlyWindow { __kerfEarly?: string | null, __kerfReady?: boolean }

/** Marks the page ready (later taps reach the buttons themselves) and answers the action tapped before, if any. */
export function takeEarlyTap(): string | null {
  const w = window as unknown as EarlyWindow
  w.__kerfReady = true
  const action = w.__kerfEarly ?? null
  w.__kerfEarly = null
  for (const el of document.querySelectorAll('[data-early][aria-busy="true"]')) el.removeAttribute('aria-busy')
  return action
}
