'use client';

import { useEffect, type RefObject } from 'react';

// Bars that stay on screen over the page mark themselves with these attributes; a form keeps
// what the person is working on between them.
const TOP_BARS = '[data-sticky-top]';
const BOTTOM_BARS = '[data-sticky-bottom]';
const GAP = 8;

/** A field form's action bar: one row, above the field places bar (--places-h); use-form-fit lifts it over the keyboard. */
export const FORM_BAR = 'sticky bottom-[var(--places-h,0px)] z-10 -mx-3 flex items-stretch gap-2 border-t-2 border-line bg-ground px-3 py-2';

/** The part of the layout viewport that shows, less the bars over it (visualViewport: less the keyboard too). */
function clearBand(except?: Element | null) {
  const vv = window.visualViewport;
  let top = vv ? vv.offsetTop : 0;
  let bottom = vv ? vv.offsetTop + vv.height : window.innerHeight;
  for (const bar of document.querySelectorAll(TOP_BARS)) {
    const r = bar.getBoundingClientRect();
    if (r.height > 0 && r.top <= top + 1) top = Math.max(top, r.bottom);
  }
  // Lowest first: a form's bar sits on the field places bar, which sits on the screen's edge.
  const bars = [...document.querySelectorAll(BOTTOM_BARS)]
    .filter((bar) => !bar.contains(except ?? null))
    .map((bar) => bar.getBoundingClientRect())
    .filter((r) => r.height > 0)
    .sort((a, b) => b.bottom - a.bottom);
  for (const r of bars) if (r.top < bottom && r.bottom >= bottom - 1) bottom = r.top;
  return { top, bottom };
}

/**
 * Scrolls so that `el` (and, when it fits, the group it belongs to: the field with the verdict
 * that reads it, marked data-reads) sits in the clear band.
 */
export function keepInView(el: Element) {
  const band = clearBand(el);
  const group = el.closest('[data-reads]');
  let r = el.getBoundingClientRect();
  if (group) {
    const g = group.getBoundingClientRect();
    if (g.height <= band.bottom - band.top - 2 * GAP) r = g;
  }
  if (r.bottom > band.bottom - GAP) window.scrollBy(0, r.bottom - band.bottom + GAP);
  else if (r.top < band.top + GAP) window.scrollBy(0, r.top - band.top - GAP);
}

const isField = (el: Element | null): el is HTMLElement => !!el && el.matches('input, textarea, select, button');

/**
 * A form that fits the hand: when it opens, its heading comes to the top of the clear band so its
 * first field shows uncovered; its action bar (`bar`) rides above the on-screen keyboard; and the
 * focused field, with the verdict that reads it, is scrolled clear of every bar as the person
 * types, as the keyboard opens, and as the field's verdict grows.
 */
export function useFormFit(form: RefObject<HTMLElement | null>, bar: RefObject<HTMLElement | null>) {
  useEffect(() => {
    const root = form.current;
    if (!root) return;
    const band = clearBand();
    const top = root.getBoundingClientRect().top;
    if (top < band.top + GAP || top > band.top + (band.bottom - band.top) / 3) window.scrollBy(0, top - band.top - GAP);

    const vv = window.visualViewport;
    const lift = () => {
      const el = bar.current;
      if (!el) return;
      // Where the bar would sit, against what still shows above the keyboard (or a pinch-zoom).
      el.style.transform = '';
      const visibleBottom = vv ? vv.offsetTop + vv.height : window.innerHeight;
      const under = el.getBoundingClientRect().bottom - visibleBottom;
      if (under > 0) el.style.transform = `translateY(-${under}px)`;
    };
    const follow = () => {
      const active = document.activeElement;
      if (isField(active) && root.contains(active) && !bar.current?.contains(active)) keepInView(active);
    };
    const onViewport = () => {
      lift();
      follow();
    };
    const onFocus = (e: FocusEvent) => {
      if (isField(e.target as Element) && !bar.current?.contains(e.target as Node)) requestAnimationFrame(() => keepInView(e.target as Element));
    };
    // A verdict that appears or grows below the field while typing must not push the field's
    // group under the bar.
    const onInput = () => requestAnimationFrame(follow);
    lift();
    vv?.addEventListener('resize', onViewport);
    vv?.addEventListener('scroll', lift);
    window.addEventListener('resize', onViewport);
    root.addEventListener('focusin', onFocus);
    root.addEventListener('input', onInput);
    return () => {
      vv?.removeEventListener('resize', onViewport);
      vv?.removeEventListener('scroll', lift);
      window.removeEventListener('resize', onViewport);
      root.removeEventListener('focusin', onFocus);
      root.removeEventListener('input', onInput);
    };
  }, [form, bar]);
}
