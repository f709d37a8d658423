// The theme script for <head> (plain module, so the server layout gets the string, not a client reference).
export const THEME_KEY = "kw-theme";

/** Runs in <head> before anything paints: resolve the choice and keep following the system setting. */
export const themeScript = `(function(){try{var d=document.documentElement,m=window.matchMedia("(prefers-color-scheme: dark)");
function c(){var v=null;try{v=localStorage.getItem("${THEME_KEY}")}catch(e){}return v==="light"||v==="dark"?v:"system"}
function a(){var v=c();d.dataset.theme=v==="system"?(m.matches?"dark":"light"):v;d.dataset.themeChoice=v}
a();m.addEventListener("change",a);window.addEventListener("storage",a);window.__kwApplyTheme=a}catch(e){}})();`;

