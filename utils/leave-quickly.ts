// Leaving a page for another document (the next label scanned, a reload) without waiting for it.
// vue-router keeps the scroll position in history.state from a `pagehide` listener, so that Back
// after a full load lands where the person was. Run there, its history.replaceState makes the
// browser bring the old page's style up to date and handle a same-document navigation before the
// next page may start: 40 to 240 ms on a phone's slowed CPU in traces of a repeat scan (npm run
// bench:phone, KERFBOOK_PHONE_TRACE). LEAVE_QUICKLY_SCRIPT, set in the page head by nuxt.config.ts,
// keeps the same position whenever scrolling settles, when reading it costs nothing, and stops
// `pagehide` before vue-router's listener: listeners on window run in the order they were added,
// and this one is added before any module runs. Nothing else of the app listens for pagehide.

/** Runs in the page head before any other script: plain ES5, no imports. */
export const LEAVE_QUICKLY_SCRIPT = `(function(){var w=window,t;w.addEventListener('pagehide',function(e){e.stopImmediatePropagation()},true);
w.addEventListener('scroll',function(){clearTimeout(t);t=setTimeout(function(){var s=history.state,n={},k;if(!s||typeof s!=='object')return;
for(k in s)n[k]=s[k];n.scroll={left:w.scrollX,top:w.scrollY};history.replaceState(n,'')},200)},{passive:true})})()`
