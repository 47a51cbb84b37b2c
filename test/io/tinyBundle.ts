/**
 * A tiny valid CSV bundle written out by hand: a unit cube hex8 (nodes 1-8) with a tet4 on its
 * top face (nodes 5, 6, 8 and 9), uniaxial stress σxx = 10 (so each line is easy to read).
 * Line numbers the tests rely on: nodes.csv line k+1 holds node k; elements.csv line 2 the hex,
 * line 3 the tet; stress.csv line k+1 node k.
 */
export type Bundle = Record<string, string>

export function tinyBundle(): Bundle {
  return {
    'nodes.csv': [
      'id,x,y,z',
      '1,0,0,0', '2,1,0,0', '3,1,1,0', '4,0,1,0',
      '5,0,0,1', '6,1,0,1', '7,1,1,1', '8,0,1,1',
      '9,0.5,0.5,2',
    ].join('\n') + '\n',
    'elements.csv': [
      'id,type,n1,n2,n3,n4,n5,n6,n7,n8',
      '1,hex8,1,2,3,4,5,6,7,8',
      '2,tet4,5,6,8,9',
    ].join('\n') + '\n',
    'stress.csv': ['id,sxx,syy,szz,sxy,syz,sxz', ...[1, 2, 3, 4, 5, 6, 7, 8, 9].map((i) => `${i},10,0,0,0,0,0`)].join('\n') + '\n',
    'displacement.csv': ['id,ux,uy,uz', ...[1, 2, 3, 4, 5, 6, 7, 8, 9].map((i) => `${i},0.001,0,0`)].join('\n') + '\n',
    'model.json': JSON.stringify({ name: 'tiny', units: { length: 'm', stress: 'MPa' }, bodyForce: [0, 0, 0] }) + '\n',
  }
}

/** Replaces line `line` (1-based) of a text; `null` deletes it. */
export function setLine(text: string, line: number, value: string | null): string {
  const lines = text.split('\n')
  if (value === null) lines.splice(line - 1, 1)
  else lines[line - 1] = value
  return lines.join('\n')
}

export function toFiles(b: Bundle): { name: string; text: string }[] {
  return Object.entries(b).map(([name, text]) => ({ name, text }))
}
