import { describe, expect, it } from 'vitest'
import { classifyRenderer } from '../../../src/scene/rendererKind.ts'

describe('classifyRenderer', () => {
  it('recognises software renderers by name (strings as browsers report them; common practice)', () => {
    expect(classifyRenderer('ANGLE (Google, Vulkan 1.3.0 (SwiftShader Device (Subzero) (0x0000C0DE)), SwiftShader driver)')).toBe('software')
    expect(classifyRenderer('llvmpipe (LLVM 15.0.6, 256 bits)')).toBe('software')
    expect(classifyRenderer('Google SwiftShader')).toBe('software')
    expect(classifyRenderer('Microsoft Basic Render Driver')).toBe('software')
    expect(classifyRenderer('ANGLE (NVIDIA, NVIDIA GeForce RTX 3060 Direct3D11 vs_5_0 ps_5_0, D3D11)')).toBe('hardware')
    expect(classifyRenderer('Apple M1')).toBe('hardware')
    expect(classifyRenderer('')).toBe('unknown')
  })
})
