/** The demo page: the built-in synthetic inscription, its title and scale, and the truth overlay. */
import { useEffect, useLayoutEffect, useRef, useState } from 'react';
import type { InscriptionTruth } from '../src/synth/types.ts';
import { drawDemo, fitScale } from './drawDemo.ts';

const DEMO = `${import.meta.env.BASE_URL}demo/`;

type Loaded = { image: HTMLImageElement; truth: InscriptionTruth };

async function loadDemo(): Promise<Loaded> {
  const res = await fetch(`${DEMO}truth.json`);
  if (!res.ok) throw new Error(`the demo inscription is missing (${res.status}); run npm run demo`);
  const truth = (await res.json()) as InscriptionTruth;
  const image = new Image();
  image.src = `${DEMO}visible.png`;
  await image.decode();
  return { image, truth };
}

export function DemoView() {
  const [demo, setDemo] = useState<Loaded>();
  const [failure, setFailure] = useState<string>();
  const [showTruth, setShowTruth] = useState(false);
  const [box, setBox] = useState({ w: 0, h: 0 });
  const [cursorMm, setCursorMm] = useState<string>('–');
  const stage = useRef<HTMLDivElement>(null);
  const canvas = useRef<HTMLCanvasElement>(null);

  useEffect(() => {
    let live = true;
    loadDemo().then((d) => live && setDemo(d), (e: Error) => live && setFailure(e.message));
    return () => {
      live = false;
    };
  }, []);

  // The canvas follows the size of its stage, so the photo always fits the window.
  useLayoutEffect(() => {
    const el = stage.current;
    if (!el) return;
    const observer = new ResizeObserver(([entry]) => setBox({ w: entry.contentRect.width, h: entry.contentRect.height }));
    observer.observe(el);
    return () => observer.disconnect();
  }, []);

  const scale = demo ? fitScale(demo.image.naturalWidth, demo.image.naturalHeight, box.w, box.h) : 1;

  useEffect(() => {
    if (!demo || !canvas.current || box.w === 0) return;
    drawDemo(canvas.current, demo.image, demo.truth, scale, showTruth);
    canvas.current.dataset.state = 'ready';
  }, [demo, scale, showTruth, box.w]);

  const onMove = (e: React.PointerEvent<HTMLCanvasElement>) => {
    if (!demo) return;
    const rect = e.currentTarget.getBoundingClientRect();
    const x = (e.clientX - rect.left) / scale / demo.truth.pxPerMm;
    const y = (e.clientY - rect.top) / scale / demo.truth.pxPerMm;
    setCursorMm(`${x.toFixed(1)}, ${y.toFixed(1)} mm`);
  };

  return (
    <div className="page">
      <header className="bar">
        <span className="product">inkroute</span>
        <h1 className="find">{demo?.truth.title ?? 'Loading the demo inscription…'}</h1>
        <label className="toggle">
          <input type="checkbox" checked={showTruth} onChange={(e) => setShowTruth(e.target.checked)} disabled={!demo} />
          Show true centrelines
        </label>
      </header>
      <p className="note" role="note">
        A facsimile is an interpretation, not a copy: every traced stroke is a reading of the ink,
        and restored spans (parts of a stroke with no visible ink under the pen) are marked as restored.
      </p>
      <main className="stage" ref={stage}>
        {failure ? <p className="failure">{failure}</p> : (
          <canvas ref={canvas} aria-label="Photo of the demo inscription" onPointerMove={onMove} onPointerLeave={() => setCursorMm('–')} />
        )}
      </main>
      <footer className="status">
        <span>scale {demo ? `${demo.truth.pxPerMm.toFixed(1)} px/mm` : '–'}</span>
        <span>zoom {demo ? `${Math.round(scale * 100)} %` : '–'}</span>
        <span>cursor {cursorMm}</span>
        <span>{demo ? `${demo.truth.width}×${demo.truth.height} px, ${demo.truth.strokes.length} strokes` : ''}</span>
      </footer>
    </div>
  );
}
