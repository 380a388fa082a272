import { type DesignReport } from '@kerfwright/contracts';
import { Canvas, useFrame, useThree } from '@react-three/fiber';
import {
  type KeyboardEvent,
  memo,
  useCallback,
  useEffect,
  useId,
  useLayoutEffect,
  useMemo,
  useRef,
  useState,
} from 'react';
import * as THREE from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { pieceHasShape, pieceSlab, type SlabArrays } from './piece-slab';
import {
  applyViewCommand,
  eyeOffset,
  FIT_DISTANCE_PER_MM,
  fittedDiameterMm,
  HOME_VIEW,
  MAX_DISTANCE_SCALE,
  MAX_TILT_DEG,
  MIN_DISTANCE_SCALE,
  type PreviewView,
  type ViewCommand,
  viewCommandForKey,
  viewFromEye,
  viewsMatch,
} from './preview-view';
import { PreviewViewControls } from './preview-view-controls';
import { isSoftwareWebGl } from './render-quality';
import { pieceColour } from '../../layout/components/piece-colours';

interface ModelPreview3dProps {
  report: DesignReport;
  pieceColours: Record<string, number>;
  /** Identifies the model shown; written to `data-rendered-key` once a frame with it has been drawn. */
  modelKey: string;
  selectedPiece?: string;
  onSelectPiece?: (id: string) => void;
}

/**
 * One BufferGeometry per piece id, kept while the preview is on screen: an edit that keeps a piece's
 * triangle count (a size, thickness or kerf change usually does) rewrites its buffers in place, so three.js
 * updates the GPU buffers instead of deleting and creating them.
 */
function useGeometryPool() {
  const pool = useRef(new Map<string, THREE.BufferGeometry>());
  useEffect(() => {
    const geometries = pool.current;
    // Disposing frees the GPU buffers only; a geometry drawn again is uploaded again.
    return () => geometries.forEach((g) => g.dispose());
  }, []);
  return pool.current;
}

function writeSlab(geometry: THREE.BufferGeometry, slab: SlabArrays): void {
  const position = geometry.getAttribute('position') as THREE.BufferAttribute | undefined;
  const normal = geometry.getAttribute('normal') as THREE.BufferAttribute | undefined;
  if (position && normal && position.array.length === slab.positions.length) {
    (position.array as Float32Array).set(slab.positions);
    (normal.array as Float32Array).set(slab.normals);
    position.needsUpdate = true;
    normal.needsUpdate = true;
  } else {
    // A new size of buffer: three.js cannot resize a GPU buffer, so the geometry gets new ones.
    geometry.dispose();
    geometry.setAttribute('position', new THREE.BufferAttribute(slab.positions, 3));
    geometry.setAttribute('normal', new THREE.BufferAttribute(slab.normals, 3));
  }
  geometry.computeBoundingSphere();
  geometry.computeBoundingBox();
}

/** Memoised: turning the view re-renders the preview, and leaves the pieces alone. */
const Pieces = memo(function Pieces({
  report,
  pieceColours,
  modelKey,
  selectedPiece,
  onSelectPiece,
  software,
}: ModelPreview3dProps & { software: boolean }) {
  const invalidate = useThree((s) => s.invalidate);
  const pool = useGeometryPool();
  const slabs = useMemo(() => drawableSlabs(report), [report]);
  const geometryOf = (id: string) => {
    let geometry = pool.get(id);
    if (!geometry) {
      geometry = new THREE.BufferGeometry();
      pool.set(id, geometry);
    }
    return geometry;
  };
  // Fill the pooled geometries before the frame is drawn; drop those of pieces that are gone.
  useLayoutEffect(() => {
    const ids = new Set(slabs.map((s) => s.id));
    for (const { id, slab } of slabs) writeSlab(geometryOf(id), slab);
    for (const [id, geometry] of pool) {
      if (!ids.has(id)) {
        geometry.dispose();
        pool.delete(id);
      }
    }
    // geometryOf only reads and fills the pool, which lives as long as this component.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [slabs, pool]);

  // Mark the canvas once a frame with this model has really been drawn (the browser test times edits by it):
  // this callback takes over drawing (priority 1), so the mark follows the draw call of that very frame.
  const pending = useRef<string | null>(null);
  useLayoutEffect(() => {
    pending.current = modelKey;
    invalidate();
  }, [slabs, pieceColours, modelKey, invalidate]);
  useFrame(({ gl: renderer, scene, camera }) => {
    renderer.render(scene, camera);
    if (pending.current !== null) {
      renderer.domElement.setAttribute('data-rendered-key', pending.current);
      pending.current = null;
    }
  }, 1);

  return (
    <group>
      {slabs.map(({ id }) => (
        <mesh
          key={id}
          geometry={geometryOf(id)}
          onClick={(event) => {
            event.stopPropagation();
            onSelectPiece?.(id);
          }}
        >
          {software ? (
            <meshLambertMaterial
              color={pieceColour(pieceColours[id])}
              emissive={id === selectedPiece ? '#5a2a10' : '#000000'}
            />
          ) : (
            <meshStandardMaterial
              color={pieceColour(pieceColours[id])}
              emissive={id === selectedPiece ? '#5a2a10' : '#000000'}
              roughness={0.75}
              metalness={0.02}
            />
          )}
        </mesh>
      ))}
    </group>
  );
});

/**
 * The slab of every piece that has a shape; a piece with none (a model too small for its stock) is left out,
 * as is one whose numbers are not finite, so three.js never meets empty or NaN bounds.
 */
export function drawableSlabs(report: DesignReport): { id: string; slab: SlabArrays }[] {
  const thicknessMm = report.stock.thicknessMm;
  if (!(Number.isFinite(thicknessMm) && thicknessMm > 0)) return [];
  return report.pieces
    .filter(pieceHasShape)
    .map((p) => ({ id: p.id, slab: pieceSlab(p, thicknessMm) }))
    .filter(({ slab }) => slab.positions.length > 0 && slab.positions.every(Number.isFinite));
}

/** Puts the camera where `view` says, looking at its target, for a model of this (fitted) diameter. */
function placeEye(
  camera: THREE.Camera,
  controls: OrbitControls,
  view: PreviewView,
  diameterMm: number,
): void {
  const [x, y, z] = eyeOffset(view, diameterMm);
  const [tx, ty, tz] = view.target;
  controls.target.set(tx, ty, tz);
  camera.position.set(tx + x, ty + y, tz + z);
  // Turns the camera to the target (and keeps it within the limits below).
  controls.update();
}

/**
 * Orbit with the mouse (drag to turn, right-drag to pan, scroll to zoom) from the eye that `view` sets; the
 * keys and buttons change `view`, and a finished drag or scroll reports the eye it left through onViewSettled.
 * The camera frames the model's diameter.
 */
function Controls({
  diameterMm,
  view,
  onViewSettled,
}: {
  diameterMm: number;
  view: PreviewView;
  onViewSettled: (view: PreviewView) => void;
}) {
  const camera = useThree((s) => s.camera);
  const gl = useThree((s) => s.gl);
  const invalidate = useThree((s) => s.invalidate);
  const controlsRef = useRef<OrbitControls | null>(null);
  // The view to start new controls from (they are made again for a new size): the latest one placed.
  const viewRef = useRef(view);
  const d = fittedDiameterMm(diameterMm);
  useEffect(() => {
    camera.near = d / 100;
    camera.far = d * 20;
    camera.updateProjectionMatrix();
    const controls = new OrbitControls(camera, gl.domElement);
    controls.enableDamping = false;
    // The keys' limits: a drag cannot leave the eye where the next key press would make it jump.
    controls.minPolarAngle = THREE.MathUtils.degToRad(90 - MAX_TILT_DEG);
    controls.maxPolarAngle = THREE.MathUtils.degToRad(90 + MAX_TILT_DEG);
    controls.minDistance = FIT_DISTANCE_PER_MM * d * MIN_DISTANCE_SCALE;
    controls.maxDistance = FIT_DISTANCE_PER_MM * d * MAX_DISTANCE_SCALE;
    placeEye(camera, controls, viewRef.current, d);
    const redraw = () => invalidate();
    const settled = () => {
      const offset = camera.position.clone().sub(controls.target);
      onViewSettled(viewFromEye([offset.x, offset.y, offset.z], controls.target.toArray(), d));
    };
    controls.addEventListener('change', redraw);
    controls.addEventListener('end', settled);
    controlsRef.current = controls;
    invalidate();
    return () => {
      controls.removeEventListener('change', redraw);
      controls.removeEventListener('end', settled);
      controls.dispose();
      controlsRef.current = null;
    };
  }, [camera, gl, invalidate, d, onViewSettled]);
  useEffect(() => {
    viewRef.current = view;
    const controls = controlsRef.current;
    if (controls) {
      placeEye(camera, controls, view, d);
      invalidate();
    }
  }, [camera, invalidate, view, d]);
  return null;
}

/** What the focused preview's keys do; also its accessible description. */
const KEYS_HINT =
  'Drag to turn, scroll to zoom. Or select the view with Tab or a click: the arrow keys turn it, + and − zoom, Home resets it.';

/**
 * The view of the model, kept with the diameter it was set for: a model of another size opens at the starting
 * view, as the camera is fitted to the new size.
 */
function useView(diameterMm: number) {
  const [held, setHeld] = useState({ diameterMm, view: HOME_VIEW });
  const view = Object.is(held.diameterMm, diameterMm) ? held.view : HOME_VIEW;
  const move = useCallback(
    (command: ViewCommand) =>
      setHeld((h) => ({
        diameterMm,
        view: applyViewCommand(Object.is(h.diameterMm, diameterMm) ? h.view : HOME_VIEW, command),
      })),
    [diameterMm],
  );
  // After a drag or a scroll: a click that moved nothing keeps the same state, so nothing re-renders.
  const settle = useCallback(
    (next: PreviewView) =>
      setHeld((h) =>
        Object.is(h.diameterMm, diameterMm) && viewsMatch(h.view, next) ? h : { diameterMm, view: next },
      ),
    [diameterMm],
  );
  return { view, move, settle };
}

/**
 * The assembled model in 3D (three.js through React Three Fiber). Drag to orbit, scroll to zoom; with the view
 * focused, the arrow keys turn and tilt it, + and - zoom and Home resets it, and buttons below do the same for
 * anyone who cannot drag. Memoised: a studio re-render that does not change the model, its colours or the
 * selection leaves the scene alone.
 */
export const ModelPreview3d = memo(function ModelPreview3d(props: ModelPreview3dProps) {
  const software = useMemo(isSoftwareWebGl, []);
  const { view, move, settle } = useView(props.report.diameterMm);
  const hintId = useId();
  // A cheap look at the outlines; the slabs themselves are built once, in Pieces.
  const drawable = props.report.stock.thicknessMm > 0 && props.report.pieces.some(pieceHasShape);
  if (!drawable) {
    return (
      <Box
        data-testid="preview-3d-empty"
        sx={{
          height: '100%',
          display: 'grid',
          placeItems: 'center',
          bgcolor: '#f4f1ea',
          borderRadius: 2,
          p: 3,
        }}
      >
        <Typography color="text.secondary" sx={{ textAlign: 'center' }}>
          Nothing to show at this size: the slots take up every piece. Make the model larger or the stock
          thinner.
        </Typography>
      </Box>
    );
  }
  const onKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    // Only keys meant for the view itself: not those of something inside it, nor browser shortcuts.
    if (event.target !== event.currentTarget || event.altKey || event.ctrlKey || event.metaKey) return;
    const command = viewCommandForKey(event.key);
    if (command === null) return;
    // The arrows and Home would scroll the page otherwise.
    event.preventDefault();
    move(command);
  };
  return (
    <Box sx={{ height: '100%', display: 'flex', flexDirection: 'column' }}>
      {/* "application": a screen reader passes the arrow keys through to the view instead of reading on. */}
      <Box
        role="application"
        aria-label="3D preview of the assembled model"
        aria-describedby={hintId}
        tabIndex={0}
        onKeyDown={onKeyDown}
        data-turn-deg={view.turnDeg.toFixed(1)}
        data-tilt-deg={view.tiltDeg.toFixed(1)}
        data-distance-scale={view.distanceScale.toFixed(3)}
        sx={{
          flex: 1,
          minHeight: 0,
          borderRadius: 2,
          '&:focus-visible': { outline: '3px solid', outlineColor: 'primary.main', outlineOffset: 2 },
        }}
      >
        <Canvas
          data-testid="preview-3d"
          frameloop="demand"
          dpr={software ? 1 : [1, 2]}
          gl={{ preserveDrawingBuffer: true, antialias: !software }}
          camera={{ fov: 40 }}
          style={{ background: '#f4f1ea', borderRadius: 8 }}
        >
          <ambientLight intensity={0.9} />
          <directionalLight position={[300, 500, 400]} intensity={1.6} />
          <directionalLight position={[-400, -200, -300]} intensity={0.6} />
          <Controls diameterMm={props.report.diameterMm} view={view} onViewSettled={settle} />
          <Pieces {...props} software={software} />
        </Canvas>
      </Box>
      <Box sx={{ display: 'flex', flexWrap: 'wrap', alignItems: 'center', columnGap: 2, pt: 0.5 }}>
        <PreviewViewControls onCommand={move} />
        <Typography id={hintId} variant="caption" color="text.secondary" sx={{ flex: '1 1 16rem' }}>
          {KEYS_HINT}
        </Typography>
      </Box>
    </Box>
  );
});
