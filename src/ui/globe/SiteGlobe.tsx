import { kelvin } from '../format';
import { useEffect, useRef, useState, type JSX } from 'react';
import * as THREE from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import type { BodyName } from '../../core/types';
import {
  BODY_COLOURS,
  bodyFixedToScene,
  BODY_ARTICLED,
  cssRgb,
  latLonToScene,
  roundPick,
  sceneToLatLon,
  isValueLayer,
  NO_VALUE_RGB,
  shadingColour,
  shadingSurfaceColour,
  valueColour,
  shadingProblem,
  type V3,
} from './globeMath';
import { FlatSitePicker } from './FlatSitePicker';
import { earthCoastlines, moonNearFarBoundary, type LatLonLine } from './surfaceFeatures';

export interface GlobeShading {
  nLat: number;
  nLon: number;
  /** Cell centres. */
  lat_deg: Float64Array;
  lon_deg: Float64Array;
  /** Row-major lat x lon, 0..1 (fraction of time the Earth is above the horizon). */
  fraction: Float32Array;
  label?: string;
  /**
   * Optional, for a value layer on any body (e.g. a survey figure from core/surveyLayer.ts, which has
   * exactly these fields): raw values (NaN = none), their range and unit. Drawn cell by cell in cividis
   * with a min-max legend; without them the grid is the Moon's Earth-visibility fraction.
   */
  values?: Float32Array;
  min?: number;
  max?: number;
  unit?: string;
}

export interface SiteGlobeProps {
  body: BodyName;
  lat_deg: number;
  lon_deg: number;
  /** Click (not drag) on the sphere; lon in [-180, 180). */
  onPick: (lat_deg: number, lon_deg: number) => void;
  /** Unit vectors in the BODY-FIXED frame (x: lat 0 lon 0, z: north pole). */
  sunDir?: [number, number, number] | null;
  earthDir?: [number, number, number] | null;
  shading?: GlobeShading | null;
  /** The Moon's sub-Earth point [lat, lon] at the moment shown (marked beside the near/far-side boundary). */
  subEarth?: [number, number] | null;
}

const CLICK_SLOP_PX = 4;
const CAMERA_DISTANCE = 5.9;
const SUN_COLOUR = 0xffb000;
const EARTH_ARROW_COLOUR = 0x3d8bff;
const SITE_COLOUR = 0xe8112d;
/** Coastlines: a pale sand on the Earth's blue. */
const COAST_COLOUR = 0xf3e3b3;
/** The Moon's near/far-side boundary: a green no other globe mark uses. */
const NEARFAR_COLOUR = 0x2fd27a;
const NEARFAR_CSS = '#5fe39b';

function webglAvailable(): boolean {
  try {
    const c = document.createElement('canvas');
    const gl = (c.getContext('webgl2') || c.getContext('webgl')) as WebGLRenderingContext | null;
    // Give the probe context back at once: browsers allow only a few live WebGL contexts.
    gl?.getExtension('WEBGL_lose_context')?.loseContext();
    return !!gl;
  } catch {
    return false;
  }
}

/** Text on a sprite, drawn into a small canvas (no fonts or images fetched). */
function labelSprite(text: string, colour: string, scale = 0.22): THREE.Sprite {
  const c = document.createElement('canvas');
  const ctx = c.getContext('2d')!;
  const font = 'bold 40px "DejaVu Sans", Arial, sans-serif';
  ctx.font = font;
  const w = Math.ceil(ctx.measureText(text).width) + 16;
  c.width = w;
  c.height = 56;
  ctx.font = font;
  ctx.textBaseline = 'middle';
  ctx.lineWidth = 8;
  ctx.strokeStyle = 'rgba(0,0,0,0.85)';
  ctx.strokeText(text, 8, 28);
  ctx.fillStyle = colour;
  ctx.fillText(text, 8, 28);
  const tex = new THREE.CanvasTexture(c);
  tex.colorSpace = THREE.SRGBColorSpace;
  const sprite = new THREE.Sprite(new THREE.SpriteMaterial({ map: tex, depthTest: true, depthWrite: false, transparent: true }));
  sprite.scale.set((scale * w) / 56, scale, 1);
  sprite.renderOrder = 10;
  return sprite;
}

function v3(a: V3): THREE.Vector3 {
  return new THREE.Vector3(a[0], a[1], a[2]);
}

/** Latitude/longitude lines every 30 deg (equator and prime meridian stronger), just above the surface. */
function gridLines(): THREE.Group {
  const g = new THREE.Group();
  const r = 1.003;
  const minor: number[] = [];
  const major: number[] = [];
  const push = (arr: number[], a: V3, b: V3) => arr.push(...a, ...b);
  for (let lat = -60; lat <= 60; lat += 30) {
    const arr = lat === 0 ? major : minor;
    for (let lon = 0; lon < 360; lon += 3) push(arr, latLonToScene(lat, lon, r), latLonToScene(lat, lon + 3, r));
  }
  for (let lon = -180; lon < 180; lon += 30) {
    const arr = lon === 0 ? major : minor;
    for (let lat = -90; lat < 90; lat += 3) push(arr, latLonToScene(lat, lon, r), latLonToScene(lat + 3, lon, r));
  }
  const mk = (pts: number[], colour: number, opacity: number) => {
    const geo = new THREE.BufferGeometry();
    geo.setAttribute('position', new THREE.Float32BufferAttribute(pts, 3));
    return new THREE.LineSegments(geo, new THREE.LineBasicMaterial({ color: colour, transparent: true, opacity }));
  };
  // A mid grey-blue reads on the light near side, the dark "never" violet and the plain body colours alike.
  g.add(mk(minor, 0x5a6172, 0.8));
  g.add(mk(major, 0x5a6172, 1));
  // A few labels so the user knows which way is east.
  const labels: [number, number, string][] = [];
  for (let lon = -150; lon <= 180; lon += 30) {
    labels.push([0, lon, lon === 0 || lon === 180 ? `${lon}°` : `${Math.abs(lon)}°${lon < 0 ? 'W' : 'E'}`]);
  }
  for (const lat of [-60, -30, 30, 60]) {
    for (const lon of [-135, -45, 45, 135]) labels.push([lat, lon, `${Math.abs(lat)}°${lat < 0 ? 'S' : 'N'}`]);
  }
  for (const [lat, lon, t] of labels) {
    const s = labelSprite(t, '#ffffff', 0.12);
    s.position.copy(v3(latLonToScene(lat, lon, 1.04)));
    s.material.depthTest = false;
    // Shown only while facing the viewer (see faceLabels), so no label sits on the limb or shows through.
    s.userData.gridLabel = true;
    g.add(s);
  }
  return g;
}

/** Lines of [lat, lon] points as line segments just above the surface. */
function latLonLines(lines: LatLonLine[], colour: number, r: number, opacity = 1): THREE.LineSegments {
  const pts: number[] = [];
  for (const l of lines) for (let i = 1; i < l.length; i++) pts.push(...latLonToScene(l[i - 1][0], l[i - 1][1], r), ...latLonToScene(l[i][0], l[i][1], r));
  const geo = new THREE.BufferGeometry();
  geo.setAttribute('position', new THREE.Float32BufferAttribute(pts, 3));
  return new THREE.LineSegments(geo, new THREE.LineBasicMaterial({ color: colour, transparent: opacity < 1, opacity }));
}

function faceLabel(text: string, colour: string, lat: number, lon: number, scale = 0.12): THREE.Sprite {
  const s = labelSprite(text, colour, scale);
  s.position.copy(v3(latLonToScene(lat, lon, 1.04)));
  s.material.depthTest = false;
  s.userData.gridLabel = true;
  return s;
}

/** What belongs to the body's surface: the Earth's coastlines; the Moon's near/far-side boundary and sub-Earth point. */
function surfaceFeatures(body: BodyName, subEarth: [number, number] | null): THREE.Group {
  const g = new THREE.Group();
  g.name = 'surface-features';
  if (body === 'earth') {
    const coast = latLonLines(earthCoastlines(), COAST_COLOUR, 1.002);
    coast.name = 'coastlines';
    g.add(coast);
  }
  if (body === 'moon') {
    const b = latLonLines(moonNearFarBoundary(), NEARFAR_COLOUR, 1.004);
    b.name = 'near-far-boundary';
    g.add(b);
    g.add(faceLabel('near side', NEARFAR_CSS, 15, 0));
    g.add(faceLabel('far side', NEARFAR_CSS, 15, 180));
    g.add(faceLabel('boundary', NEARFAR_CSS, -15, 90, 0.1));
    g.add(faceLabel('boundary', NEARFAR_CSS, -15, -90, 0.1));
    if (subEarth && subEarth.every(Number.isFinite)) {
      const p = v3(latLonToScene(subEarth[0], subEarth[1], 1.0));
      const ring = new THREE.Mesh(new THREE.RingGeometry(0.035, 0.052, 32), new THREE.MeshBasicMaterial({ color: EARTH_ARROW_COLOUR, side: THREE.DoubleSide }));
      ring.position.copy(p.clone().multiplyScalar(1.003));
      ring.lookAt(p.clone().multiplyScalar(2));
      ring.name = 'sub-earth';
      g.add(ring);
      g.add(faceLabel('sub-Earth point', '#7fb2ff', subEarth[0] - 7, subEarth[1], 0.1));
    }
  }
  return g;
}

function srgbToLinear(c: number): number {
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

/** Per-vertex surface colours: the body colour, or the Earth-visibility shading for the Moon. */
function paintSurface(geo: THREE.BufferGeometry, body: BodyName, shading: GlobeShading | null): void {
  const pos = geo.getAttribute('position') as THREE.BufferAttribute;
  const colours = new Float32Array(pos.count * 3);
  const base = BODY_COLOURS[body];
  for (let i = 0; i < pos.count; i++) {
    let c = base;
    if (shading) {
      const [lat, lon] = sceneToLatLon([pos.getX(i), pos.getY(i), pos.getZ(i)]);
      c = shadingSurfaceColour(shading, lat, lon);
    }
    // Our colours are sRGB (as in the CSS legend); three.js shades in linear light.
    colours[3 * i] = srgbToLinear(c[0]);
    colours[3 * i + 1] = srgbToLinear(c[1]);
    colours[3 * i + 2] = srgbToLinear(c[2]);
  }
  geo.setAttribute('color', new THREE.BufferAttribute(colours, 3));
  (geo.getAttribute('color') as THREE.BufferAttribute).needsUpdate = true;
}

function directionArrow(dir: V3, colour: number, text: string, cssColour: string): THREE.Group {
  const g = new THREE.Group();
  const d = v3(dir).normalize();
  const from = d.clone().multiplyScalar(1.03);
  const arrow = new THREE.ArrowHelper(d, from, 0.36, colour, 0.12, 0.08);
  g.add(arrow);
  const s = labelSprite(text, cssColour, 0.13);
  s.position.copy(d.clone().multiplyScalar(1.42));
  // Anchored toward the globe's centre on screen (see faceLabels), so it stays inside the view.
  s.userData.arrowLabel = true;
  s.material.depthTest = false;
  g.add(s);
  return g;
}

/** Grid labels: visible only well inside the visible hemisphere. Arrow labels: extend from the tip toward the centre. */
function faceLabels(scene: THREE.Scene, camera: THREE.PerspectiveCamera): void {
  const view = camera.position.clone().normalize();
  const right = new THREE.Vector3(1, 0, 0).applyQuaternion(camera.quaternion);
  const up = new THREE.Vector3(0, 1, 0).applyQuaternion(camera.quaternion);
  // Grid labels also make way for the site marker (by angle) and the arrows' labels (on screen).
  const avoid = (scene.userData.avoid as THREE.Vector3[] | undefined) ?? [];
  const cosClear = Math.cos((14 * Math.PI) / 180);
  const sprites: THREE.Sprite[] = [];
  scene.traverse((o) => { if (o instanceof THREE.Sprite) sprites.push(o); });
  const arrowNdc: THREE.Vector3[] = [];
  for (const o of sprites) {
    if (!o.userData.arrowLabel) continue;
    const p = o.getWorldPosition(new THREE.Vector3());
    o.center.set(p.dot(right) > 0 ? 1 : 0, p.dot(up) > 0 ? 1.1 : -0.1);
    // Hidden only when the tip is behind the globe's disc as seen from the camera.
    const along = p.dot(view);
    const perp = p.clone().sub(view.clone().multiplyScalar(along)).length();
    o.visible = !(along < 0 && perp < 1.05);
    if (o.visible) {
      const ndc = p.clone().project(camera);
      // Centre of the label box: it extends from the anchor away from the tip.
      ndc.x += p.dot(right) > 0 ? -0.1 : 0.1;
      ndc.y += p.dot(up) > 0 ? -0.05 : 0.05;
      arrowNdc.push(ndc);
    }
  }
  for (const o of sprites) {
    if (!o.userData.gridLabel) continue;
    const n = o.position.clone().normalize();
    let vis = n.dot(view) > 0.3 && avoid.every((a) => n.dot(a) < cosClear);
    if (vis && arrowNdc.length) {
      const q = o.getWorldPosition(new THREE.Vector3()).project(camera);
      vis = arrowNdc.every((a) => Math.abs(a.x - q.x) > 0.2 || Math.abs(a.y - q.y) > 0.1);
    }
    o.visible = vis;
  }
}

interface Scene3 {
  renderer: THREE.WebGLRenderer;
  scene: THREE.Scene;
  camera: THREE.PerspectiveCamera;
  controls: OrbitControls;
  surface: THREE.Mesh<THREE.SphereGeometry, THREE.MeshLambertMaterial>;
  site: THREE.Group;
  arrows: THREE.Group;
  features: THREE.Group;
  render: () => void;
  dispose: () => void;
}

function buildScene(canvas: HTMLCanvasElement, onRendered: () => void): Scene3 {
  const renderer = new THREE.WebGLRenderer({ canvas, antialias: true, preserveDrawingBuffer: true });
  renderer.setPixelRatio(Math.min(2, window.devicePixelRatio || 1));
  renderer.setClearColor(0x0b1020, 1);
  const scene = new THREE.Scene();
  const camera = new THREE.PerspectiveCamera(30, 1, 0.1, 100);
  camera.position.set(0, 0, CAMERA_DISTANCE);
  // Even light from the viewer's side (a headlight) so no part of the view is hidden in shadow.
  scene.add(new THREE.AmbientLight(0xffffff, 1.0));
  const head = new THREE.DirectionalLight(0xffffff, 1.35);
  camera.add(head);
  head.position.set(0.4, 0.6, 1);
  scene.add(camera);

  const surface = new THREE.Mesh(
    new THREE.SphereGeometry(1, 144, 72),
    new THREE.MeshLambertMaterial({ vertexColors: true }),
  );
  scene.add(surface);
  scene.add(gridLines());

  const site = new THREE.Group();
  const dot = new THREE.Mesh(new THREE.SphereGeometry(0.035, 16, 12), new THREE.MeshBasicMaterial({ color: SITE_COLOUR }));
  const ring = new THREE.Mesh(
    new THREE.RingGeometry(0.045, 0.062, 32),
    new THREE.MeshBasicMaterial({ color: 0xffffff, side: THREE.DoubleSide }),
  );
  ring.position.z = 0.002;
  const zenith = new THREE.ArrowHelper(new THREE.Vector3(0, 0, 1), new THREE.Vector3(0, 0, 0), 0.22, SITE_COLOUR, 0.06, 0.04);
  site.add(dot, ring, zenith);
  scene.add(site);

  const arrows = new THREE.Group();
  scene.add(arrows);
  const features = new THREE.Group();
  scene.add(features);

  const controls = new OrbitControls(camera, canvas);
  controls.enablePan = false;
  // No wheel zoom: scrolling the page over the globe must scroll the page.
  controls.enableZoom = false;
  controls.enableDamping = false;
  controls.minDistance = 2.2;
  controls.maxDistance = 12;
  controls.rotateSpeed = 0.6;

  let pending = false;
  const render = () => {
    if (pending) return;
    pending = true;
    requestAnimationFrame(() => {
      pending = false;
      faceLabels(scene, camera);
      renderer.render(scene, camera);
      // Apparent radius of the sphere on screen (CSS px), for tests that click on it.
      const d = camera.position.length();
      const half = canvas.clientHeight / 2;
      canvas.dataset.sphereRadiusPx = ((half * Math.tan(Math.asin(Math.min(1, 1 / d)))) / Math.tan((camera.fov * Math.PI) / 360)).toFixed(1);
      onRendered();
    });
  };
  controls.addEventListener('change', render);

  const dispose = () => {
    controls.dispose();
    scene.traverse((o) => {
      const m = o as THREE.Mesh;
      if (m.geometry) m.geometry.dispose();
      const mat = (m as { material?: THREE.Material | THREE.Material[] }).material;
      for (const x of Array.isArray(mat) ? mat : mat ? [mat] : []) {
        (x as THREE.SpriteMaterial).map?.dispose();
        x.dispose();
      }
    });
    renderer.dispose();
  };
  return { renderer, scene, camera, controls, surface, site, arrows, features, render, dispose };
}

function updateAvoid(s: Scene3): void {
  const u = s.scene.userData;
  u.avoid = [...(u.siteDir ? [u.siteDir] : []), ...((u.arrowDirs as THREE.Vector3[] | undefined) ?? [])];
}

/** Points the camera at (lat, lon) from its current distance, north up. */
function faceSite(s: Scene3, lat: number, lon: number): void {
  const dist = s.camera.position.length() || CAMERA_DISTANCE;
  // Tilt a little off the pole so OrbitControls never sits exactly on its axis.
  const la = Math.max(-85, Math.min(85, lat));
  s.camera.position.copy(v3(latLonToScene(la, lon, dist)));
  s.camera.up.set(0, 1, 0);
  s.controls.target.set(0, 0, 0);
  s.controls.update();
}

function ShadingLegend({ shading }: { shading: GlobeShading }): JSX.Element {
  const stops = [0.001, 0.25, 0.5, 0.75, 1].map((t) => `${cssRgb(shadingColour(t))} ${t * 100}%`).join(', ');
  return (
    <div className="globe-legend" style={{ font: '12px/1.4 system-ui, sans-serif', marginTop: 4 }}>
      <div>{shading.label ?? 'Earth above the horizon (fraction of time)'}</div>
      <div style={{ display: 'flex', alignItems: 'center', columnGap: 6, rowGap: 2, flexWrap: 'wrap' }}>
        <span style={{ whiteSpace: 'nowrap' }}>
          <span aria-hidden="true" style={{ display: 'inline-block', width: 14, height: 12, background: cssRgb(shadingColour(0)), border: '1px solid #555', verticalAlign: 'middle', marginRight: 4 }} />
          never
        </span>
        <span style={{ whiteSpace: 'nowrap' }}>
          0 %{' '}
          <span aria-hidden="true" style={{ display: 'inline-block', width: 90, height: 12, background: `linear-gradient(to right, ${stops})`, border: '1px solid #555', verticalAlign: 'middle' }} />
          {' '}100 % of the time
        </span>
      </div>
    </div>
  );
}

function fmtValue(v: number, unit: string | undefined): string {
  if (!Number.isFinite(v)) return '—';
  if (unit === 'K') return kelvin(v);
  const a = Math.abs(v);
  const t = a >= 100 ? Math.round(v).toLocaleString('en-US') : Number(v.toPrecision(3)).toLocaleString('en-US', { maximumFractionDigits: 6 });
  return unit ? `${t} ${unit}` : t;
}

function ValueLegend({ shading }: { shading: GlobeShading }): JSX.Element {
  const stops = [0, 0.25, 0.5, 0.75, 1].map((t) => `${cssRgb(valueColour(t))} ${t * 100}%`).join(', ');
  let missing = false;
  const v = shading.values!;
  for (let k = 0; k < v.length && !missing; k++) if (!Number.isFinite(v[k])) missing = true;
  return (
    <div className="globe-legend" data-testid="globe-value-legend" style={{ font: '12px/1.4 system-ui, sans-serif', marginTop: 4 }}>
      <div>{shading.label ?? 'Value per site'}</div>
      <div style={{ display: 'flex', alignItems: 'center', columnGap: 6, rowGap: 2, flexWrap: 'wrap' }}>
        <span style={{ whiteSpace: 'nowrap' }}>
          {fmtValue(shading.min!, shading.unit)}{' '}
          <span aria-hidden="true" style={{ display: 'inline-block', width: 90, height: 12, background: `linear-gradient(to right, ${stops})`, border: '1px solid #555', verticalAlign: 'middle' }} />
          {' '}{fmtValue(shading.max!, shading.unit)}
        </span>
        {missing && (
          <span style={{ whiteSpace: 'nowrap' }}>
            <span aria-hidden="true" style={{ display: 'inline-block', width: 14, height: 12, background: cssRgb(NO_VALUE_RGB), border: '1px solid #555', verticalAlign: 'middle', marginRight: 4 }} />
            no value
          </span>
        )}
      </div>
    </div>
  );
}

function ArrowLegend({ body, sun, earth, coast, moonMarks, subEarth }: {
  body: BodyName; sun: boolean; earth: boolean; coast: boolean; moonMarks: boolean; subEarth: boolean;
}): JSX.Element {
  const item = (colour: string, text: string) => (
    <span style={{ whiteSpace: 'nowrap' }}>
      <span aria-hidden="true" style={{ display: 'inline-block', width: 16, height: 3, background: colour, verticalAlign: 'middle', marginRight: 4 }} />
      {text}
    </span>
  );
  return (
    <div style={{ font: '12px/1.4 system-ui, sans-serif', display: 'flex', columnGap: 12, rowGap: 2, flexWrap: 'wrap', marginTop: 4 }}>
      {item('#e8112d', `Site on ${BODY_ARTICLED[body]} (arrow: zenith)`)}
      {sun && item('#ffb000', 'Direction of the Sun')}
      {earth && item('#3d8bff', 'Direction of the Earth')}
      {coast && item('#c9b06b', 'Coastlines')}
      {moonMarks && item(NEARFAR_CSS, 'Near/far-side boundary (90° E and W)')}
      {subEarth && (
        <span style={{ whiteSpace: 'nowrap' }}>
          <span aria-hidden="true" style={{ display: 'inline-block', width: 9, height: 9, borderRadius: 6, border: '2.5px solid #3d8bff', verticalAlign: 'middle', marginRight: 4 }} />
          Sub-Earth point
        </span>
      )}
    </div>
  );
}

export function SiteGlobe(props: SiteGlobeProps): JSX.Element {
  const { body, lat_deg, lon_deg, onPick, sunDir, earthDir, shading, subEarth } = props;
  const boxRef = useRef<HTMLDivElement | null>(null);
  const canvasRef = useRef<HTMLCanvasElement | null>(null);
  const s3 = useRef<Scene3 | null>(null);
  const renderCount = useRef(0);
  const lastPick = useRef<[number, number] | null>(null);
  const onPickRef = useRef(onPick);
  onPickRef.current = onPick;
  const [size, setSize] = useState(0);
  const [glError, setGlError] = useState<string | null>(() => (typeof document !== 'undefined' && !webglAvailable() ? 'WebGL is off' : null));
  const shadeIssue = shading ? shadingProblem(shading) : null;
  // Earth visibility belongs to the Moon; a value layer (survey) may cover any body.
  const usedShading = shading && !shadeIssue && (body === 'moon' || isValueLayer(shading)) ? shading : null;

  // Size: the parent's width, square.
  useEffect(() => {
    const el = boxRef.current;
    if (!el) return;
    setSize(Math.floor(el.clientWidth));
    const ro = new ResizeObserver((entries) => {
      const w = Math.floor(entries[0]?.contentRect.width ?? 0);
      if (w > 0) setSize(w);
    });
    ro.observe(el);
    return () => ro.disconnect();
  }, []);

  // Build the scene once (per canvas).
  useEffect(() => {
    const canvas = canvasRef.current;
    if (!canvas || glError) return;
    let s: Scene3;
    try {
      s = buildScene(canvas, () => {
        renderCount.current += 1;
        canvas.dataset.renderCount = String(renderCount.current);
        canvas.dataset.ready = '1';
      });
    } catch (e) {
      setGlError(e instanceof Error && e.message ? `WebGL is off (${e.message})` : 'WebGL is off');
      return;
    }
    s3.current = s;
    const onLost = (ev: Event) => {
      ev.preventDefault();
      setGlError('WebGL context lost');
    };
    canvas.addEventListener('webglcontextlost', onLost);

    // Click vs drag: a press and release within CLICK_SLOP_PX is a pick.
    let down: { x: number; y: number; id: number } | null = null;
    const onDown = (e: PointerEvent) => {
      if (e.button !== 0) return;
      down = { x: e.clientX, y: e.clientY, id: e.pointerId };
    };
    const onUp = (e: PointerEvent) => {
      const d = down;
      down = null;
      if (!d || d.id !== e.pointerId) return;
      if (Math.hypot(e.clientX - d.x, e.clientY - d.y) >= CLICK_SLOP_PX) return;
      const r = canvas.getBoundingClientRect();
      const ndc = new THREE.Vector2(((e.clientX - r.left) / r.width) * 2 - 1, -((e.clientY - r.top) / r.height) * 2 + 1);
      const ray = new THREE.Raycaster();
      ray.setFromCamera(ndc, s.camera);
      const hit = ray.intersectObject(s.surface, false)[0];
      if (!hit) return;
      const [lat, lon] = roundPick(...sceneToLatLon([hit.point.x, hit.point.y, hit.point.z]));
      lastPick.current = [lat, lon];
      onPickRef.current(lat, lon);
    };
    const onKey = (e: KeyboardEvent) => {
      const step = (e.shiftKey ? 15 : 5) * (Math.PI / 180);
      const moves: Record<string, () => void> = {
        ArrowLeft: () => s.controls.rotateLeft(step),
        ArrowRight: () => s.controls.rotateLeft(-step),
        ArrowUp: () => s.controls.rotateUp(step),
        ArrowDown: () => s.controls.rotateUp(-step),
      };
      const m = moves[e.key];
      if (!m) return;
      e.preventDefault();
      m();
      s.render();
    };
    canvas.addEventListener('pointerdown', onDown);
    canvas.addEventListener('pointerup', onUp);
    canvas.addEventListener('keydown', onKey);
    return () => {
      canvas.removeEventListener('pointerdown', onDown);
      canvas.removeEventListener('pointerup', onUp);
      canvas.removeEventListener('keydown', onKey);
      canvas.removeEventListener('webglcontextlost', onLost);
      s.dispose();
      s3.current = null;
    };
  }, [glError]);

  // Resize.
  useEffect(() => {
    const s = s3.current;
    if (!s || size <= 0) return;
    s.renderer.setSize(size, size, true);
    s.camera.aspect = 1;
    s.camera.updateProjectionMatrix();
    s.render();
  }, [size, glError]);

  // Surface colours follow the body and the shading.
  useEffect(() => {
    const s = s3.current;
    if (!s) return;
    paintSurface(s.surface.geometry, body, usedShading);
    s.render();
  }, [body, usedShading, glError]);

  // Coastlines (Earth), near/far-side boundary and sub-Earth point (Moon).
  const subKey = subEarth && subEarth.every(Number.isFinite) ? `${subEarth[0].toFixed(3)},${subEarth[1].toFixed(3)}` : '';
  useEffect(() => {
    const s = s3.current;
    if (!s) return;
    for (const c of [...s.features.children]) {
      s.features.remove(c);
      c.traverse((o) => {
        const m = o as THREE.Mesh;
        m.geometry?.dispose();
        const mat = (m as { material?: THREE.Material }).material;
        (mat as THREE.SpriteMaterial | undefined)?.map?.dispose();
        mat?.dispose();
      });
    }
    const f = surfaceFeatures(body, body === 'moon' ? subEarth ?? null : null);
    s.features.add(f);
    const canvas = canvasRef.current;
    if (canvas) canvas.dataset.features = f.children.map((c) => c.name).filter(Boolean).join(' ');
    s.render();
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [body, subKey, glError]);

  // Re-aim the camera when the body changes.
  useEffect(() => {
    const s = s3.current;
    if (!s) return;
    faceSite(s, lat_deg, lon_deg);
    s.render();
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [body, glError]);

  // Site marker; the camera follows a site typed into the form, not one just clicked.
  useEffect(() => {
    const s = s3.current;
    if (!s || !Number.isFinite(lat_deg) || !Number.isFinite(lon_deg)) return;
    const p = v3(latLonToScene(lat_deg, lon_deg, 1.0));
    s.site.position.copy(p);
    s.site.lookAt(p.clone().multiplyScalar(2));
    s.scene.userData.siteDir = p.clone().normalize();
    updateAvoid(s);
    const lp = lastPick.current;
    const fromPick = lp && Math.abs(lp[0] - lat_deg) < 1e-9 && Math.abs(lp[1] - lon_deg) < 1e-9;
    if (!fromPick) faceSite(s, lat_deg, lon_deg);
    s.render();
  }, [lat_deg, lon_deg, glError]);

  // Sun and Earth arrows.
  useEffect(() => {
    const s = s3.current;
    if (!s) return;
    for (const c of [...s.arrows.children]) {
      s.arrows.remove(c);
      c.traverse((o) => {
        const m = o as THREE.Mesh;
        m.geometry?.dispose();
        const mat = (m as { material?: THREE.Material }).material;
        (mat as THREE.SpriteMaterial | undefined)?.map?.dispose();
        mat?.dispose();
      });
    }
    const ok = (d: unknown): d is V3 => Array.isArray(d) && d.length === 3 && d.every(Number.isFinite) && Math.hypot(...(d as V3)) > 0;
    s.scene.userData.arrowDirs = [sunDir, body !== 'earth' ? earthDir : null].filter(ok).map((d) => v3(bodyFixedToScene(d)).normalize());
    updateAvoid(s);
    if (ok(sunDir)) s.arrows.add(directionArrow(bodyFixedToScene(sunDir), SUN_COLOUR, 'Sun', '#ffc640'));
    if (body !== 'earth' && ok(earthDir)) s.arrows.add(directionArrow(bodyFixedToScene(earthDir), EARTH_ARROW_COLOUR, 'Earth', '#7fb2ff'));
    s.render();
  }, [sunDir, earthDir, body, glError]);

  const fallback = glError !== null;
  return (
    <div ref={boxRef} data-testid="site-globe" style={{ width: '100%', minWidth: 0 }}>
      {fallback ? (
        <div role="group" aria-label={`Site picker for ${BODY_ARTICLED[body]} (flat map)`}>
          <p role="status" style={{ margin: '0 0 4px', font: '13px system-ui, sans-serif' }}>
            3D globe unavailable: {glError}. Showing a flat latitude/longitude map instead; click it to pick the site.
          </p>
          <FlatSitePicker body={body} lat_deg={lat_deg} lon_deg={lon_deg} onPick={onPick} shading={usedShading} width={size || 320} sunDir={sunDir} earthDir={earthDir} subEarth={subEarth} />
        </div>
      ) : (
        <canvas
          ref={canvasRef}
          tabIndex={0}
          role="img"
          aria-label={`Globe of ${BODY_ARTICLED[body]} with the site at latitude ${lat_deg.toFixed(2)}°, longitude ${lon_deg.toFixed(2)}°. Drag or use the arrow keys to turn it; click to move the site.`}
          style={{ width: size || '100%', height: size || undefined, display: 'block', cursor: 'grab', touchAction: 'none', borderRadius: 6 }}
        />
      )}
      {shadeIssue && <p role="status" style={{ font: '12px system-ui, sans-serif', color: '#a00' }}>Shading not shown: {shadeIssue}</p>}
      <ArrowLegend body={body} sun={!!sunDir} earth={body !== 'earth' && !!earthDir} coast={body === 'earth'} moonMarks={body === 'moon'} subEarth={body === 'moon' && !!subEarth} />
      {usedShading && (isValueLayer(usedShading) ? <ValueLegend shading={usedShading} /> : <ShadingLegend shading={usedShading} />)}
    </div>
  );
}
