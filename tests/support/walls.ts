import { DEMO_MATERIALS, jointFraction } from '../../shared/calc'
import type { UValueInput } from '../../shared/calc'

const block = DEMO_MATERIALS.find(m => m.id === 'corrstone-block-215')!
const mortar = DEMO_MATERIALS.find(m => m.id === 'corrstone-thin-joint-mortar')!
const eps = DEMO_MATERIALS.find(m => m.id === 'corrstone-eps-graphite')!

/**
 * The demo wall (invented demo materials): plaster, 215 mm block on 3 mm thin joints, 150 mm graphite EPS,
 * base coat and finish. The U-value tests add their own point bridges to it.
 */
export const demoWall: UValueInput = {
  layers: [
    { name: 'Gypsum plaster', thickness_mm: 13, lambda: 0.57 },
    { name: block.name, thickness_mm: 215, lambda: block.lambda, bridge: { lambda: mortar.lambda, fraction: jointFraction({ unitLength_mm: 440, unitHeight_mm: 215, joint_mm: 3 }) } },
    { name: eps.name, thickness_mm: 150, lambda: eps.lambda },
    { name: 'Base coat', thickness_mm: 5, lambda: 0.8 },
    { name: 'Silicone finish', thickness_mm: 1.5, lambda: 0.7 },
  ],
}
