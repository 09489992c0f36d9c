// Labels that do not overlap: each label in turn takes the first of its candidate places whose box is clear of the
// boxes already placed and of the obstacles, or none (greedy placement with collision boxes, common practice in
// chart and map labelling; the order of the labels is their priority).

/** An axis-aligned box in pixels: its left and top edges and its size. */
export interface LabelBox {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Boxes overlap when they share more than a hairline (touching edges do not count). */
export function boxesOverlap(a: LabelBox, b: LabelBox, gap = 0): boolean {
  return (
    a.x < b.x + b.width + gap && b.x < a.x + a.width + gap && a.y < b.y + b.height + gap && b.y < a.y + a.height + gap
  );
}

/** A box of `width` x `height` centred on (cx, cy). */
export function boxAround(cx: number, cy: number, width: number, height: number): LabelBox {
  return { x: cx - width / 2, y: cy - height / 2, width, height };
}

/** The width of a text at the report's 11 px sans-serif, estimated from its length (as legendRow does). */
export function textWidth(text: string, fontPx = 11): number {
  return text.length * fontPx * 0.56;
}

/**
 * For each label, the index of the candidate it takes, or -1 where every candidate collides. `gap` keeps that many
 * pixels between labels; obstacles (plot edges, marks) are never covered; `within`, where given, holds every label;
 * `isClear`, where given, is a further test of a place (a map's track, say, which is no box).
 */
export function placeLabels(
  candidates: LabelBox[][],
  options: { gap?: number; obstacles?: LabelBox[]; within?: LabelBox; isClear?: (box: LabelBox) => boolean } = {},
): number[] {
  const gap = options.gap ?? 2;
  const placed: LabelBox[] = [...(options.obstacles ?? [])];
  const within = options.within;
  const inside = (box: LabelBox) =>
    !within ||
    (box.x >= within.x &&
      box.y >= within.y &&
      box.x + box.width <= within.x + within.width &&
      box.y + box.height <= within.y + within.height);
  return candidates.map((boxes) => {
    const chosen = boxes.findIndex(
      (box) =>
        inside(box) && (options.isClear?.(box) ?? true) && !placed.some((other) => boxesOverlap(box, other, gap)),
    );
    if (chosen >= 0) placed.push(boxes[chosen]!);
    return chosen;
  });
}
