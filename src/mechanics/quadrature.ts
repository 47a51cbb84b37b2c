/**
 * Quadrature rules for the kernels. The rules themselves are pure math kept beside the element
 * registry (src/model/elements/quadratureRules.ts, which names their sources); which rule a type
 * or face kind uses is written in its registry record, and looked up here.
 */
import { elementType, faceKind } from '../model/elementTypes.ts'
import type { ElementTypeName, FaceKind, QuadratureRule } from '../model/elementTypes.ts'

export type { QuadratureRule } from '../model/elementTypes.ts'
export { gaussJacobi, gaussLegendre, pyramidRule, tensorRule, tetRule, triangleRule, wedgeRule } from '../model/elements/quadratureRules.ts'

/**
 * Volume rule of an element type (its registry record says which and why it is enough for
 * ∫ ρb dV and ∫ x dV with the element's own Jacobian). An unknown type is an error.
 */
export function volumeRule(type: ElementTypeName): QuadratureRule {
  return elementType(type).volumeRule
}

/** Face rule of a face kind (see src/model/elements/faceKinds.ts). An unknown kind is an error. */
export function faceRule(kind: FaceKind): QuadratureRule {
  return faceKind(kind).rule
}
