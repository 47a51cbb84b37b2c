import { useMemo } from 'react'
import type { ReactNode } from 'react'
import { Canvas } from '@react-three/fiber'
import { useStore } from '../state/store.ts'
import { classifyRenderer, probeRenderer, rendererName } from './rendererKind.ts'
import { rawColour } from './rawColour.ts'
import { BACKGROUND } from './sceneLook.ts'

/**
 * The WebGL canvas: drawn on demand only (every change invalidates), on a flat neutral
 * background. On a software renderer antialiasing is off and the pixel ratio is 1, which roughly
 * doubles the frame rate there. `flat` and `linear` switch off tone mapping and colour-space
 * conversion: every material writes display colours as they are, so the screen, the colour bar
 * and an off-screen snapshot show the same values.
 */
export function SceneCanvas({ children }: { children?: ReactNode }) {
  const probe = useMemo(() => probeRenderer(), [])
  const software = probe.kind === 'software'
  return (
    <div style={{ position: 'absolute', inset: 0, background: BACKGROUND }}>
      <Canvas
        frameloop="demand"
        flat
        linear
        dpr={software ? 1 : [1, 2]}
        gl={{ antialias: !software, alpha: false, preserveDrawingBuffer: false, powerPreference: 'high-performance' }}
        camera={{ fov: 35, near: 0.01, far: 1000, up: [0, 0, 1], position: [3, -4, 2.5] }}
        onCreated={({ gl }) => {
          gl.localClippingEnabled = true
          gl.setClearColor(rawColour(BACKGROUND), 1)
          const kind = classifyRenderer(rendererName(gl.getContext()))
          useStore.getState().setRenderer(kind === 'unknown' ? probe.kind : kind)
        }}
      >
        {children}
      </Canvas>
    </div>
  )
}
