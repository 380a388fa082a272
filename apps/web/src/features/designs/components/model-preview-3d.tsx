import { type DesignReport } from '@kerfwright/contracts';
import { Canvas, useFrame, useThree } from '@react-three/fiber';
import { memo, useEffect, useLayoutEffect, useMemo, useRef } from 'react';
import * as THREE from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { pieceHasShape, pieceSlab, type SlabArrays } from './piece-slab';
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

function Pieces({
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
}

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

/** Orbit with the mouse; the camera frames the model's diameter. */
function Controls({ diameterMm }: { diameterMm: number }) {
  const camera = useThree((s) => s.camera);
  const gl = useThree((s) => s.gl);
  const invalidate = useThree((s) => s.invalidate);
  const fitted = useRef(0);
  useEffect(() => {
    if (fitted.current !== diameterMm) {
      const d = Number.isFinite(diameterMm) ? Math.max(diameterMm, 1) : 1;
      camera.position.set(d * 0.9, d * 0.7, d * 1.3);
      camera.near = d / 100;
      camera.far = d * 20;
      camera.lookAt(0, 0, 0);
      camera.updateProjectionMatrix();
      fitted.current = diameterMm;
    }
    const controls = new OrbitControls(camera, gl.domElement);
    controls.enableDamping = false;
    const redraw = () => invalidate();
    controls.addEventListener('change', redraw);
    invalidate();
    return () => {
      controls.removeEventListener('change', redraw);
      controls.dispose();
    };
  }, [camera, gl, invalidate, diameterMm]);
  return null;
}

/**
 * The assembled model in 3D (three.js through React Three Fiber). Drag to orbit, scroll to zoom. Memoised:
 * a studio re-render that does not change the model, its colours or the selection leaves the scene alone.
 */
export const ModelPreview3d = memo(function ModelPreview3d(props: ModelPreview3dProps) {
  const software = useMemo(isSoftwareWebGl, []);
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
  return (
    <Canvas
      data-testid="preview-3d"
      frameloop="demand"
      dpr={software ? 1 : [1, 2]}
      gl={{ preserveDrawingBuffer: true, antialias: !software }}
      camera={{ fov: 40 }}
      style={{ background: '#f4f1ea', borderRadius: 8 }}
      aria-label="3D preview of the assembled model"
    >
      <ambientLight intensity={0.9} />
      <directionalLight position={[300, 500, 400]} intensity={1.6} />
      <directionalLight position={[-400, -200, -300]} intensity={0.6} />
      <Controls diameterMm={props.report.diameterMm} />
      <Pieces {...props} software={software} />
    </Canvas>
  );
});
