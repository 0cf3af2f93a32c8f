// Element.scrollIntoView also scrolls the page around the viewer; these move one box only.

/** Scrolls container just enough that el is inside it (with a margin, CSS px). */
export function revealWithin(container: HTMLElement, el: HTMLElement, margin = 8): void {
  const c = container.getBoundingClientRect();
  const r = el.getBoundingClientRect();
  if (r.top < c.top + margin) container.scrollTop -= c.top + margin - r.top;
  else if (r.bottom > c.bottom - margin) container.scrollTop += r.bottom - (c.bottom - margin);
  if (r.left < c.left + margin) container.scrollLeft -= c.left + margin - r.left;
  else if (r.right > c.right - margin) container.scrollLeft += r.right - (c.right - margin);
}

/** Scrolls container so el sits at its centre, when el is not fully in view. */
export function centreWithin(container: HTMLElement, el: HTMLElement): void {
  const c = container.getBoundingClientRect();
  const r = el.getBoundingClientRect();
  const inside = r.top >= c.top && r.bottom <= c.bottom && r.left >= c.left && r.right <= c.right;
  if (inside) return;
  container.scrollTop += r.top + r.height / 2 - (c.top + c.height / 2);
  container.scrollLeft += r.left + r.width / 2 - (c.left + c.width / 2);
}
