// Phasewise's start-up notice: a moving bar while the app loads, and the failure sentence only
// when starting fails (a script, module or WebAssembly error before the app's frame exists),
// never during a normal slow first load.
(function () {
  function failed() {
    if (document.querySelector(".shell")) return;
    var sentence = document.querySelector(".boot-failed");
    var bar = document.querySelector(".boot-progress");
    if (sentence) sentence.hidden = false;
    if (bar) bar.hidden = true;
  }
  window.addEventListener("error", failed, true);
  window.addEventListener("unhandledrejection", failed);
})();
