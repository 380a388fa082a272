import { type DesignReport } from '@kerfwright/contracts';
import { Canvas, useThree } from '@react-three/fiber';
import { useEffect, useMemo, useRef } from 'react';
import * as THREE from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import { pieceColour } from './piece-colours';

interface ModelPreview3dProps {
  report: DesignReport;
  pieceColours: Record<string, number>;
  /** Identifies the model shown; written to `data-rendered-key` once a frame with it has been drawn. */
  modelKey: string;
  selectedPiece?: string;
  onSelectPiece?: (id: string) => void;
}

/** Each piece as a flat slab of the stock's thickness, placed in its plane and coloured by the colour plan. */
function pieceGeometry(piece: DesignReport['pieces'][number], thicknessMm: number): THREE.ExtrudeGeometry {
  const shape = new THREE.Shape(piece.outline.map(([x, y]) => new THREE.Vector2(x, y)));
  const geometry = new THREE.ExtrudeGeometry(shape, { depth: thicknessMm, bevelEnabled: false });
  geometry.translate(0, 0, -thicknessMm / 2);
  const basis = new THREE.Matrix4().makeBasis(
    new THREE.Vector3(...piece.frameX),
    new THREE.Vector3(...piece.frameY),
    new THREE.Vector3(...piece.normal),
  );
  basis.setPosition(new THREE.Vector3(...piece.centreMm));
  geometry.applyMatrix4(basis);
  return geometry;
}

function Pieces({ report, pieceColours, modelKey, selectedPiece, onSelectPiece }: ModelPreview3dProps) {
  const invalidate = useThree((s) => s.invalidate);
  const gl = useThree((s) => s.gl);
  const geometries = useMemo(
    () => report.pieces.map((p) => ({ id: p.id, geometry: pieceGeometry(p, report.stock.thicknessMm) })),
    [report],
  );
  useEffect(() => () => geometries.forEach((g) => g.geometry.dispose()), [geometries]);

  // Mark the canvas once a frame with this model has really been drawn (the browser test times edits by it).
  useEffect(() => {
    invalidate();
    let second = 0;
    const first = requestAnimationFrame(() => {
      second = requestAnimationFrame(() => gl.domElement.setAttribute('data-rendered-key', modelKey));
    });
    return () => {
      cancelAnimationFrame(first);
      cancelAnimationFrame(second);
    };
  }, [geometries, pieceColours, modelKey, invalidate, gl]);

  return (
    <group>
      {geometries.map(({ id, geometry }) => (
        <mesh
          key={id}
          geometry={geometry}
          onClick={(event) => {
            event.stopPropagation();
            onSelectPiece?.(id);
          }}
        >
          <meshStandardMaterial
            color={pieceColour(pieceColours[id])}
            emissive={id === selectedPiece ? '#5a2a10' : '#000000'}
            roughness={0.75}
            metalness={0.02}
          />
        </mesh>
      ))}
    </group>
  );
}

/** Orbit with the mouse; the camera frames the model's diameter. */
function Controls({ diameterMm }: { diameterMm: number }) {
  const camera = useThree((s) => s.camera);
  const gl = useThree((s) => s.gl);
  const invalidate = useThree((s) => s.invalidate);
  const fitted = useRef(0);
  useEffect(() => {
    if (fitted.current !== diameterMm) {
      const d = Math.max(diameterMm, 1);
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

/** The assembled model in 3D (three.js through React Three Fiber). Drag to orbit, scroll to zoom. */
export function ModelPreview3d(props: ModelPreview3dProps) {
  return (
    <Canvas
      data-testid="preview-3d"
      frameloop="demand"
      dpr={[1, 2]}
      gl={{ preserveDrawingBuffer: true, antialias: true }}
      camera={{ fov: 40 }}
      style={{ background: '#f4f1ea', borderRadius: 8 }}
      aria-label="3D preview of the assembled model"
    >
      <ambientLight intensity={0.9} />
      <directionalLight position={[300, 500, 400]} intensity={1.6} />
      <directionalLight position={[-400, -200, -300]} intensity={0.6} />
      <Controls diameterMm={props.report.diameterMm} />
      <Pieces {...props} />
    </Canvas>
  );
}
