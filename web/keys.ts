// Keyboard shortcuts of the review screen (ignored while typing in a form field).

import { typingInForm } from './dom';

export interface ReviewKeys {
  active: () => boolean;
  step: (dir: 1 | -1, flaggedOnly: boolean) => void;
  first: () => void;
  last: () => void;
  toggleExclusion: () => void;
  zoom: (factor: number) => void;
}

/** ← → previous / next breath, Shift+← → previous / next breath that is not ok, Home / End, X exclude, + − zoom. */
export function bindReviewKeys(k: ReviewKeys): void {
  document.addEventListener('keydown', (e) => {
    if (!k.active() || typingInForm(e.target) || e.ctrlKey || e.metaKey || e.altKey) return;
    const key = e.key;
    if (key === 'ArrowRight' || key === 'ArrowLeft') k.step(key === 'ArrowRight' ? 1 : -1, e.shiftKey);
    else if (key === 'Home') k.first();
    else if (key === 'End') k.last();
    else if (key === 'x' || key === 'X') k.toggleExclusion();
    else if (key === '+' || key === '=') k.zoom(0.5);
    else if (key === '-' || key === '_') k.zoom(2);
    else return;
    e.preventDefault();
  });
}
