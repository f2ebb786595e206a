/**
 * The canvas in the centre of the editor: a Konva stage of five layers, each one Shape
 * whose sceneFunc draws straight into the layer's context (draw.ts):
 *   photo    the current surface's first band, from its pyramid, only what is on screen
 *   overlay  the ink evidence in amber, at the chosen opacity
 *   strokes  the inked bodies in ink black, brought to 70 % as a whole (overlaps do not
 *            darken), and the restored spans' dashed slate outlines
 *   marks    selection, anchors, ductus arrows
 *   live     the Follow preview and pending anchors (redrawn alone as the pointer moves)
 * The layers redraw from store subscriptions, not React renders, and only those a
 * change touches; Konva batches each to the next animation frame, except the live layer,
 * which draws as soon as a preview arrives. Empty layers are hidden. At full size and
 * below, strokes and restored spans come from cached tiles (tiles.ts).
 */
import type Konva from 'konva';
import { useEffect, useLayoutEffect, useRef, useState } from 'react';
import { Layer, Shape, Stage } from 'react-konva';
import { getEngine } from '../engine/instance.ts';
import type { EditorState } from '../store/store.ts';
import { editorStore, useEditor } from '../store/useEditor.ts';
import { drawImageLayer, drawLiveLayer, drawMarkLayer, drawStrokeLayer, type Frame } from './draw.ts';
import { followProjectImages, imageEntry, subscribeImages } from './images.ts';
import { drawLetterLayer, hasLetterMarks } from './letters.ts';
import { attachPointer } from './pointer.ts';
import { probe } from './probe.ts';
import { runTools, selectedAnchor } from './tools.ts';
import { canvasBox, currentImage, fitToWindow, setCanvasBox } from './view.ts';

type LayerName = keyof typeof probe.drawMs;
const LAYERS: LayerName[] = ['photo', 'overlay', 'strokes', 'marks', 'live'];

function frame(): Frame {
  const { width, height } = canvasBox();
  return { state: editorStore.getState(), width, height, dpr: window.devicePixelRatio || 1 };
}

/** Runs one layer's drawing on the native context, timing it for the perf test. */
function timed(name: LayerName, ctx: Konva.Context, draw: (c: CanvasRenderingContext2D) => void): void {
  const t0 = performance.now();
  const c = ctx._context;
  // Opacity belongs to whole layers (the overlay's CSS opacity, the strokes' own pass), never to a shape.
  c.globalAlpha = 1;
  draw(c);
  probe.drawMs[name] = performance.now() - t0;
}

/** Whether the live layer has anything to show. */
function hasLive(s: EditorState): boolean {
  return (s.preview?.length ?? 0) > 0 || s.pending.length > 0;
}

/** Whether the marks layer may have anything to show: a selection, Refine's anchors, the ductus, letters and text marks. */
function hasMarks(s: EditorState): boolean {
  return s.selection.length > 0 || s.tool === 'refine' || s.showDuctus || hasLetterMarks(s);
}

export function InkCanvas() {
  const wrap = useRef<HTMLDivElement>(null);
  const layers = useRef<Partial<Record<LayerName, Konva.Layer | null>>>({});
  const [size, setSize] = useState({ width: 0, height: 0 });
  const needsFit = useRef(false);
  const overlayOn = useEditor((s) => s.overlay);
  const overlayOpacity = useEditor((s) => s.overlayOpacity);
  const liveOn = useEditor(hasLive);
  const marksOn = useEditor(hasMarks);
  const hasPhoto = useRef(false);

  const setLayer = (name: LayerName, l: Konva.Layer | null) => {
    layers.current[name] = l;
    const c = l?.getNativeCanvasElement();
    if (!c) return;
    c.dataset.layer = name;
    if (name === 'overlay') c.style.opacity = String(editorStore.getState().overlayOpacity);
  };

  const redraw = (...names: LayerName[]) => {
    for (const n of names) layers.current[n]?.batchDraw();
  };

  useLayoutEffect(() => {
    const el = wrap.current;
    if (!el) return;
    const observer = new ResizeObserver(([entry]) => {
      const width = Math.floor(entry.contentRect.width);
      const height = Math.floor(entry.contentRect.height);
      setCanvasBox(width, height);
      setSize({ width, height });
      if (needsFit.current && width > 0 && height > 0) {
        needsFit.current = false;
        fitToWindow(editorStore);
      }
    });
    observer.observe(el);
    return () => observer.disconnect();
  }, []);

  // Opacity of whole layers, on their canvases: per-shape alpha would darken overlaps.
  // A layer shown again draws what it has now (it was left alone while hidden).
  useEffect(() => {
    if (liveOn) layers.current.live?.draw();
  }, [liveOn]);
  useEffect(() => {
    if (marksOn) layers.current.marks?.draw();
  }, [marksOn]);

  useEffect(() => {
    const overlay = layers.current.overlay?.getNativeCanvasElement();
    if (overlay) overlay.style.opacity = String(overlayOpacity);
  }, [overlayOpacity]);

  useEffect(() => {
    redraw(...LAYERS);
  }, [size]);

  useEffect(() => {
    const el = wrap.current;
    if (!el) return;
    const engine = getEngine();
    const stopTools = runTools(editorStore, engine);
    const stopPointer = attachPointer(el, editorStore);
    const stopImages = followProjectImages(editorStore, engine, currentImage, () => {
      hasPhoto.current = false;
      el.dataset.state = 'loading';
      const { width, height } = canvasBox();
      if (width > 0 && height > 0) fitToWindow(editorStore);
      else needsFit.current = true;
      redraw('photo', 'overlay');
    });
    const stopImageDraws = subscribeImages(() => redraw('photo', 'overlay'));
    const unsubscribe = editorStore.subscribe((s, prev) => {
      if (s.zoom !== prev.zoom || s.panX !== prev.panX || s.panY !== prev.panY) {
        // Empty layers are hidden and left alone: every canvas redrawn costs the browser a copy and a blend.
        redraw('photo', 'strokes');
        if (s.overlay) redraw('overlay');
        if (hasMarks(s)) redraw('marks');
        if (hasLive(s)) redraw('live');
        return;
      }
      if (s.project !== prev.project || s.selection !== prev.selection || s.tool !== prev.tool || s.showDuctus !== prev.showDuctus) {
        redraw('strokes', 'marks');
      }
      // The preview is drawn at once, not on the next frame: it is what the pointer waits for.
      if (s.preview !== prev.preview || s.pending !== prev.pending) layers.current.live?.draw();
      if (s.toolPath !== prev.toolPath || s.letterSelection !== prev.letterSelection || s.guide !== prev.guide) redraw('marks');
      if (s.overlay !== prev.overlay) redraw('overlay');
    });
    return () => {
      unsubscribe();
      stopImageDraws();
      stopImages();
      stopPointer();
      stopTools();
    };
  }, []);

  const photoScene = (ctx: Konva.Context) => timed('photo', ctx, (c) => {
    const entry = imageEntry(currentImage(editorStore.getState().project)?.id);
    drawImageLayer(c, frame(), entry?.photo);
    if (entry?.photo && !hasPhoto.current && wrap.current) {
      hasPhoto.current = true;
      wrap.current.dataset.state = 'ready';
    }
  });
  const overlayScene = (ctx: Konva.Context) => timed('overlay', ctx, (c) => {
    const s = editorStore.getState();
    if (s.overlay) drawImageLayer(c, frame(), imageEntry(currentImage(s.project)?.id)?.overlay);
  });
  const strokeScene = (ctx: Konva.Context) => timed('strokes', ctx, (c) => drawStrokeLayer(c, frame()));
  const markScene = (ctx: Konva.Context) => timed('marks', ctx, (c) => {
    c.save();
    drawMarkLayer(c, frame(), selectedAnchor());
    c.restore();
    drawLetterLayer(c, frame());
  });
  const liveScene = (ctx: Konva.Context) => timed('live', ctx, (c) => {
    const end = drawLiveLayer(c, frame());
    if (end) {
      probe.previewDrawnAt = performance.now();
      probe.previewEnd = { x: end.x, y: end.y };
    }
  });

  const layer = (name: LayerName, scene: (ctx: Konva.Context) => void, visible = true) => (
    <Layer key={name} ref={(l) => setLayer(name, l)} listening={false} visible={visible}>
      <Shape listening={false} perfectDrawEnabled={false} sceneFunc={scene} />
    </Layer>
  );

  return (
    <div className="canvas" ref={wrap} tabIndex={-1} data-state="loading" aria-label="Photo of the surface with the traced strokes">
      {size.width > 0 && size.height > 0 && (
        <Stage width={size.width} height={size.height} listening={false}>
          {layer('photo', photoScene)}
          {layer('overlay', overlayScene, overlayOn)}
          {layer('strokes', strokeScene)}
          {layer('marks', markScene, marksOn)}
          {layer('live', liveScene, liveOn)}
        </Stage>
      )}
    </div>
  );
}
