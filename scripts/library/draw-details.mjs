/**
 * Draws the section and plan SVGs of the detail library from the details' front matter.
 *
 * Run: node scripts/library/draw-details.mjs
 * Reads content/details/*.md, writes public/library/drawings/<code>.svg.
 *
 * Plain Node (no packages, no TypeScript runner) so it can run before dependencies are installed.
 * Geometry is written in millimetres with the outer face of the blockwork at x = 0 and y growing
 * downward; each drawing is then scaled to fit the sheet, so the layers keep their proportions.
 * Every drawing is invented for the demo library.
 */
import { readFileSync, readdirSync, writeFileSync, mkdirSync } from 'node:fs'
import { join, dirname } from 'node:path'
import { fileURLToPath } from 'node:url'

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..')
const detailsDir = join(root, 'content', 'details')
const outDir = join(root, 'public', 'library', 'drawings')

// ---------------------------------------------------------------- sheet
const SHEET_W = 840
const SHEET_H = 594
const AREA = { x0: 205, x1: 635, y0: 34, y1: 462 } // drawing area in px; labels sit either side
const LEFT_LEADER_END = 196
const RIGHT_LEADER_END = 644
const FONT = 'font-family="sans-serif"'

// Layer thicknesses common to the system (mm).
const RENDER = 8 // base coat with mesh + primer + finish
const ADHESIVE = 5
const PLASTER = 13

/** @param {string} s */
function esc(s) {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')
}

/** @param {number} n */
function f(n) {
  return (Math.round(n * 10) / 10).toString()
}

// ---------------------------------------------------------------- hatch patterns (px, printable)
const PATTERNS = `
  <pattern id="p-block" patternUnits="userSpaceOnUse" width="7" height="7" patternTransform="rotate(45)">
    <rect width="7" height="7" fill="#ffffff"/><line x1="0" y1="0" x2="0" y2="7" stroke="#000" stroke-width="0.6"/>
  </pattern>
  <pattern id="p-dense" patternUnits="userSpaceOnUse" width="5" height="5" patternTransform="rotate(45)">
    <rect width="5" height="5" fill="#ffffff"/><line x1="0" y1="0" x2="0" y2="5" stroke="#000" stroke-width="0.6"/>
    <line x1="2.5" y1="0" x2="2.5" y2="5" stroke="#000" stroke-width="0.3"/>
  </pattern>
  <pattern id="p-concrete" patternUnits="userSpaceOnUse" width="16" height="16">
    <rect width="16" height="16" fill="#ffffff"/>
    <circle cx="3" cy="4" r="0.9" fill="#000"/><circle cx="11" cy="9" r="0.7" fill="#000"/>
    <circle cx="6" cy="13" r="0.6" fill="#000"/><path d="M10 2 l2.5 1.2 l-2.2 1.6 z" fill="none" stroke="#000" stroke-width="0.5"/>
    <path d="M1 9 l2 -1.5 l1 2.2 z" fill="none" stroke="#000" stroke-width="0.5"/>
  </pattern>
  <pattern id="p-eps" patternUnits="userSpaceOnUse" width="10" height="8">
    <rect width="10" height="8" fill="#ffffff"/><path d="M0 4 L2.5 0 L7.5 8 L10 4" fill="none" stroke="#555" stroke-width="0.6"/>
  </pattern>
  <pattern id="p-geps" patternUnits="userSpaceOnUse" width="10" height="8">
    <rect width="10" height="8" fill="#eeeeee"/><path d="M0 4 L2.5 0 L7.5 8 L10 4" fill="none" stroke="#222" stroke-width="0.6"/>
  </pattern>
  <pattern id="p-mw" patternUnits="userSpaceOnUse" width="12" height="6">
    <rect width="12" height="6" fill="#ffffff"/><path d="M0 3 Q3 0 6 3 T12 3" fill="none" stroke="#000" stroke-width="0.6"/>
  </pattern>
  <pattern id="p-xps" patternUnits="userSpaceOnUse" width="6" height="6">
    <rect width="6" height="6" fill="#dddddd"/><line x1="0" y1="3" x2="6" y2="3" stroke="#000" stroke-width="0.5"/>
  </pattern>
  <pattern id="p-render" patternUnits="userSpaceOnUse" width="3" height="3">
    <rect width="3" height="3" fill="#bbbbbb"/><circle cx="1.5" cy="1.5" r="0.5" fill="#000"/>
  </pattern>
  <pattern id="p-plaster" patternUnits="userSpaceOnUse" width="4" height="4">
    <rect width="4" height="4" fill="#e6e6e6"/><circle cx="2" cy="2" r="0.4" fill="#444"/>
  </pattern>
  <pattern id="p-soil" patternUnits="userSpaceOnUse" width="14" height="14">
    <rect width="14" height="14" fill="#ffffff"/><path d="M1 13 l5 -5 M8 6 l4 -4" stroke="#555" stroke-width="0.6"/>
    <circle cx="10" cy="11" r="0.6" fill="#555"/>
  </pattern>
  <pattern id="p-gravel" patternUnits="userSpaceOnUse" width="10" height="10">
    <rect width="10" height="10" fill="#ffffff"/><circle cx="3" cy="3" r="2" fill="none" stroke="#000" stroke-width="0.5"/>
    <circle cx="8" cy="7.5" r="1.6" fill="none" stroke="#000" stroke-width="0.5"/>
  </pattern>
  <pattern id="p-timber" patternUnits="userSpaceOnUse" width="8" height="8">
    <rect width="8" height="8" fill="#ffffff"/><path d="M0 0 L8 8 M8 0 L0 8" stroke="#000" stroke-width="0.4"/>
  </pattern>
  <pattern id="p-filler" patternUnits="userSpaceOnUse" width="4" height="4">
    <rect width="4" height="4" fill="#ffffff"/><circle cx="1" cy="1" r="0.5" fill="#000"/><circle cx="3" cy="3" r="0.5" fill="#000"/>
  </pattern>`

const FILLS = {
  block: 'url(#p-block)',
  dense: 'url(#p-dense)',
  concrete: 'url(#p-concrete)',
  eps: 'url(#p-eps)',
  geps: 'url(#p-geps)',
  mw: 'url(#p-mw)',
  xps: 'url(#p-xps)',
  render: 'url(#p-render)',
  plaster: 'url(#p-plaster)',
  soil: 'url(#p-soil)',
  gravel: 'url(#p-gravel)',
  timber: 'url(#p-timber)',
  filler: 'url(#p-filler)',
  steel: '#555555',
  frame: '#cfcfcf',
  white: '#ffffff',
  membrane: '#000000',
}

// ---------------------------------------------------------------- drawing model (mm)
/**
 * @typedef {[number, number]} Pt
 * @typedef {{ kind: 'poly', pts: Pt[], fill: string, stroke?: string, sw?: number, open?: boolean, dash?: string }} Poly
 * @typedef {{ kind: 'dim', a: Pt, b: Pt, off: number, text: string }} Dim
 * @typedef {{ kind: 'label', at: Pt, text: string, side: 'left' | 'right' }} Label
 * @typedef {{ kind: 'note', at: Pt, text: string, size?: number, anchor?: string }} Note
 * @typedef {Poly | Dim | Label | Note} Item
 */

class Drawing {
  constructor() {
    /** @type {Item[]} */
    this.items = []
  }

  /** Filled rectangle between two corners. @param {number} x1 @param {number} y1 @param {number} x2 @param {number} y2 @param {string} fill @param {Partial<Poly>} [o] */
  rect(x1, y1, x2, y2, fill, o = {}) {
    this.poly([[x1, y1], [x2, y1], [x2, y2], [x1, y2]], fill, o)
  }

  /** @param {Pt[]} pts @param {string} fill @param {Partial<Poly>} [o] */
  poly(pts, fill, o = {}) {
    this.items.push({ kind: 'poly', pts, fill, stroke: '#000', sw: 0.8, ...o })
  }

  /** Open polyline. @param {Pt[]} pts @param {number} [sw] @param {string} [dash] */
  line(pts, sw = 0.8, dash) {
    this.items.push({ kind: 'poly', pts, fill: 'none', stroke: '#000', sw, open: true, dash })
  }

  /** The air barrier line is drawn the same way on every sheet: heavy dashes. @param {Pt[]} pts */
  airBarrier(pts) {
    this.line(pts, 1.8, '7 3')
  }

  /** @param {Pt} a @param {Pt} b @param {number} off px, positive = left/up of a->b @param {string} [text] */
  dim(a, b, off, text) {
    const len = Math.hypot(b[0] - a[0], b[1] - a[1])
    this.items.push({ kind: 'dim', a, b, off, text: text ?? String(Math.round(len)) })
  }

  /** @param {Pt} at @param {string} text @param {'left' | 'right'} side */
  label(at, text, side) {
    this.items.push({ kind: 'label', at, text, side })
  }

  /** @param {Pt} at @param {string} text @param {number} [size] @param {string} [anchor] */
  note(at, text, size = 10, anchor = 'middle') {
    this.items.push({ kind: 'note', at, text, size, anchor })
  }
}

// ---------------------------------------------------------------- render to SVG
/** @param {Drawing} d */
function bbox(d) {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity
  for (const it of d.items) {
    /** @type {Pt[]} */
    const pts = it.kind === 'poly' ? it.pts : it.kind === 'dim' ? [it.a, it.b] : it.kind === 'note' ? [it.at] : [it.at]
    for (const [x, y] of pts) {
      x0 = Math.min(x0, x); y0 = Math.min(y0, y); x1 = Math.max(x1, x); y1 = Math.max(y1, y)
    }
  }
  return { x0, y0, x1, y1 }
}

/** Splits text into lines of about `width` characters. @param {string} text @param {number} [width] */
function wrap(text, width = 34) {
  const words = text.split(' ')
  /** @type {string[]} */
  const lines = []
  let cur = ''
  for (const w of words) {
    if ((cur + ' ' + w).trim().length > width && cur) {
      lines.push(cur)
      cur = w
    } else cur = (cur + ' ' + w).trim()
  }
  if (cur) lines.push(cur)
  return lines
}

/**
 * @param {Drawing} d
 * @param {{ code: string, title: string, revision: string, revisionDate: string, view: string, typeLabel: string }} meta
 */
function render(d, meta) {
  const b = bbox(d)
  const w = b.x1 - b.x0
  const h = b.y1 - b.y0
  const aw = AREA.x1 - AREA.x0 - 30
  const ah = AREA.y1 - AREA.y0 - 30
  const s = Math.min(aw / w, ah / h)
  const ox = AREA.x0 + (AREA.x1 - AREA.x0 - w * s) / 2 - b.x0 * s
  const oy = AREA.y0 + (AREA.y1 - AREA.y0 - h * s) / 2 - b.y0 * s
  /** @param {Pt} p @returns {Pt} */
  const P = p => [ox + p[0] * s, oy + p[1] * s]
  /** @param {Pt[]} pts */
  const path = pts => pts.map(p => P(p).map(f).join(',')).join(' ')

  const out = []
  for (const it of d.items) {
    if (it.kind !== 'poly') continue
    const dash = it.dash ? ` stroke-dasharray="${it.dash}"` : ''
    const tag = it.open ? 'polyline' : 'polygon'
    out.push(`<${tag} points="${path(it.pts)}" fill="${it.fill}" stroke="${it.stroke}" stroke-width="${it.sw}"${dash} stroke-linejoin="round"/>`)
  }

  for (const it of d.items) {
    if (it.kind !== 'dim') continue
    const a = P(it.a)
    const bb = P(it.b)
    const len = Math.hypot(bb[0] - a[0], bb[1] - a[1]) || 1
    const nx = (bb[1] - a[1]) / len // unit normal
    const ny = -(bb[0] - a[0]) / len
    const a2 = [a[0] + nx * it.off, a[1] + ny * it.off]
    const b2 = [bb[0] + nx * it.off, bb[1] + ny * it.off]
    const ext = (/** @type {number[]} */ p, /** @type {number[]} */ q) =>
      `<line x1="${f(p[0])}" y1="${f(p[1])}" x2="${f(q[0] + nx * 3 * Math.sign(it.off))}" y2="${f(q[1] + ny * 3 * Math.sign(it.off))}" stroke="#666" stroke-width="0.4"/>`
    out.push(ext(a, a2), ext(bb, b2))
    out.push(`<line x1="${f(a2[0])}" y1="${f(a2[1])}" x2="${f(b2[0])}" y2="${f(b2[1])}" stroke="#000" stroke-width="0.6"/>`)
    for (const p of [a2, b2]) {
      // architectural tick at 45 degrees to the dimension line
      const tx = ((bb[0] - a[0]) / len + nx) * 3
      const ty = ((bb[1] - a[1]) / len + ny) * 3
      out.push(`<line x1="${f(p[0] - tx)}" y1="${f(p[1] - ty)}" x2="${f(p[0] + tx)}" y2="${f(p[1] + ty)}" stroke="#000" stroke-width="1"/>`)
    }
    const mx = (a2[0] + b2[0]) / 2 + nx * 5 * Math.sign(it.off || 1)
    const my = (a2[1] + b2[1]) / 2 + ny * 5 * Math.sign(it.off || 1)
    let ang = (Math.atan2(bb[1] - a[1], bb[0] - a[0]) * 180) / Math.PI
    if (ang > 90) ang -= 180
    if (ang <= -90) ang += 180
    out.push(`<text x="${f(mx)}" y="${f(my)}" ${FONT} font-size="8" text-anchor="middle" dominant-baseline="middle" transform="rotate(${f(ang)} ${f(mx)} ${f(my)})">${esc(it.text)}</text>`)
  }

  for (const it of d.items) {
    if (it.kind !== 'note') continue
    const p = P(it.at)
    out.push(`<text x="${f(p[0])}" y="${f(p[1])}" ${FONT} font-size="${it.size}" font-weight="bold" fill="#444" text-anchor="${it.anchor}">${esc(it.text)}</text>`)
  }

  // Labels: stacked in a column either side, in the order of their targets, never overlapping.
  for (const side of /** @type {const} */ (['left', 'right'])) {
    const labels = d.items.filter(/** @returns {it is Label} */ it => it.kind === 'label' && it.side === side)
      .map(it => ({ it, p: P(it.at), lines: wrap(it.text) }))
      .sort((a, c) => a.p[1] - c.p[1])
    const gap = 4
    const heights = labels.map(l => l.lines.length * 10)
    /** @type {number[]} */
    const ys = []
    let next = AREA.y0
    labels.forEach((l, i) => {
      const y = Math.max(l.p[1] - heights[i] / 2, next)
      ys.push(y)
      next = y + heights[i] + gap
    })
    // pull the stack back up if it ran off the bottom of the drawing area
    let over = next - gap - AREA.y1
    for (let i = labels.length - 1; i >= 0 && over > 0; i--) {
      const room = i === 0 ? ys[0] - AREA.y0 : ys[i] - (ys[i - 1] + heights[i - 1] + gap)
      const shift = Math.min(over, Math.max(room, 0))
      for (let j = i; j < labels.length; j++) ys[j] -= shift
      over -= shift
    }
    labels.forEach((l, i) => {
      const ty = ys[i] + heights[i] / 2
      const lx = side === 'left' ? LEFT_LEADER_END : RIGHT_LEADER_END
      const elbow = side === 'left' ? lx + 8 : lx - 8
      out.push(`<polyline points="${f(l.p[0])},${f(l.p[1])} ${f(elbow)},${f(ty)} ${f(lx)},${f(ty)}" fill="none" stroke="#000" stroke-width="0.5"/>`)
      out.push(`<circle cx="${f(l.p[0])}" cy="${f(l.p[1])}" r="1.6" fill="#000"/>`)
      const tx = side === 'left' ? lx - 3 : lx + 3
      const anchor = side === 'left' ? 'end' : 'start'
      l.lines.forEach((line, k) => {
        const y = ty - ((l.lines.length - 1) * 10) / 2 + k * 10 + 3
        out.push(`<text x="${f(tx)}" y="${f(y)}" ${FONT} font-size="8.5" text-anchor="${anchor}">${esc(line)}</text>`)
      })
    })
  }

  const tb = titleBlock(meta)
  return `<?xml version="1.0" encoding="UTF-8"?>
<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${SHEET_W} ${SHEET_H}" width="${SHEET_W}" height="${SHEET_H}">
<title>${esc(`${meta.code} rev ${meta.revision}: ${meta.title} (demo drawing, invented)`)}</title>
<defs>${PATTERNS}
</defs>
<rect x="0" y="0" width="${SHEET_W}" height="${SHEET_H}" fill="#ffffff"/>
<rect x="10" y="10" width="${SHEET_W - 20}" height="${SHEET_H - 20}" fill="none" stroke="#000" stroke-width="1.2"/>
<g id="drawing">
${out.join('\n')}
</g>
${tb}
</svg>
`
}

/** @param {{ code: string, title: string, revision: string, revisionDate: string, view: string, typeLabel: string }} m */
function titleBlock(m) {
  const y = 474
  const h = SHEET_H - 10 - y
  const title = wrap(m.title, 44).slice(0, 3)
  const tsize = title.length > 2 ? 10.5 : 12
  return `<g id="title-block" ${FONT}>
<rect x="10" y="${y}" width="${SHEET_W - 20}" height="${h}" fill="#ffffff" stroke="#000" stroke-width="1.2"/>
<line x1="250" y1="${y}" x2="250" y2="${y + h}" stroke="#000" stroke-width="0.8"/>
<line x1="610" y1="${y}" x2="610" y2="${y + h}" stroke="#000" stroke-width="0.8"/>
<line x1="610" y1="${y + h / 2}" x2="${SHEET_W - 10}" y2="${y + h / 2}" stroke="#000" stroke-width="0.8"/>
<line x1="720" y1="${y + h / 2}" x2="720" y2="${y + h}" stroke="#000" stroke-width="0.8"/>
<text x="20" y="${y + 18}" font-size="11" font-weight="bold">Corrstone Building Systems Ltd</text>
<text x="20" y="${y + 32}" font-size="8.5">Corrstone single-leaf insulated wall</text>
<text x="20" y="${y + 46}" font-size="8.5">Detail library · ${esc(m.typeLabel)}</text>
<text x="20" y="${y + 66}" font-size="9" font-weight="bold">Demo drawing — invented</text>
<text x="20" y="${y + 78}" font-size="7.5">Not for construction. Indicative scale, do not measure.</text>
${title.map((t, i) => `<text x="260" y="${y + 18 + i * (tsize + 2)}" font-size="${tsize}" font-weight="bold">${esc(t)}</text>`).join('\n')}
<text x="260" y="${y + 56}" font-size="8.5">${esc(m.view)} · dimensions in mm</text>
<text x="260" y="${y + 68}" font-size="7.5">ψ and fRsi for this detail are invented demo values.</text>
<text x="260" y="${y + 79}" font-size="7">Structure and fire: confirmed by a competent designer / fire engineer under local regulations.</text>
<text x="620" y="${y + 14}" font-size="7.5">Detail code</text>
<text x="620" y="${y + 36}" font-size="16" font-weight="bold">${esc(m.code)}</text>
<text x="620" y="${y + h / 2 + 12}" font-size="7.5">Revision</text>
<text x="620" y="${y + h / 2 + 32}" font-size="14" font-weight="bold">${esc(m.revision)}</text>
<text x="730" y="${y + h / 2 + 12}" font-size="7.5">Date</text>
<text x="730" y="${y + h / 2 + 30}" font-size="10">${esc(m.revisionDate)}</text>
</g>`
}

// ---------------------------------------------------------------- wall build-up helpers
/**
 * @typedef {{ blk: number, ins: number, mat: 'geps' | 'eps' | 'mw', lining: 'plaster' | 'dry', variant: string }} Params
 */

/** x positions of the layer faces, outer face of blockwork at 0. @param {Params} p */
function layers(p) {
  const i1 = -ADHESIVE
  const i0 = i1 - p.ins
  const r0 = i0 - RENDER
  const liningT = p.lining === 'dry' ? 27.5 : PLASTER
  return { r0, i0, i1, b0: 0, b1: p.blk, l1: p.blk + liningT }
}

const MAT_TEXT = {
  geps: 'graphite EPS, bonded and anchored',
  eps: 'white EPS, bonded and anchored',
  mw: 'mineral wool board, bonded and anchored',
}

/** ETICS strip between y1 and y2. @param {Drawing} d @param {Params} p @param {number} y1 @param {number} y2 @param {string} [mat] */
function etics(d, p, y1, y2, mat) {
  const L = layers(p)
  d.rect(L.r0, y1, L.i0, y2, FILLS.render)
  d.rect(L.i0, y1, L.i1, y2, FILLS[/** @type {keyof typeof FILLS} */ (mat ?? p.mat)])
  d.rect(L.i1, y1, 0, y2, FILLS.white)
}

/** Room-side lining between y1 and y2. @param {Drawing} d @param {Params} p @param {number} y1 @param {number} y2 */
function lining(d, p, y1, y2) {
  const L = layers(p)
  if (p.lining === 'dry') {
    d.rect(p.blk, y1, p.blk + 5, y2, FILLS.plaster) // parge coat
    d.rect(p.blk + 15, y1, p.blk + 27.5, y2, FILLS.plaster)
  } else {
    d.rect(p.blk, y1, L.l1, y2, FILLS.plaster)
  }
}

/** The standard labels of the wall build-up, pointed at a height y. @param {Drawing} d @param {Params} p @param {number} y */
function wallLabels(d, p, y) {
  const L = layers(p)
  d.label([L.r0 + 3, y], 'Base coat with glass-fibre mesh, primer and render finish', 'left')
  d.label([(L.i0 + L.i1) / 2, y + 30], `${p.ins} mm ${MAT_TEXT[p.mat]}`, 'left')
  d.label([p.blk / 2, y + 60], `${p.blk} mm lightweight aggregate-concrete block on 3 mm thin-layer mortar`, 'right')
  d.label([L.l1 - 4, y + 90], p.lining === 'dry' ? 'Parge coat (air barrier) and plasterboard on dabs' : '13 mm gypsum plaster (air barrier)', 'right')
}

/** Dimensions of the wall build-up at height y. @param {Drawing} d @param {Params} p @param {number} y */
function wallDims(d, p, y) {
  const L = layers(p)
  d.dim([L.i0, y], [L.i1, y], 14, String(p.ins))
  d.dim([0, y], [p.blk, y], 14, String(p.blk))
}

/** Bed-joint lines so the blockwork reads as coursed units. @param {Drawing} d @param {number} x1 @param {number} x2 @param {number} y1 @param {number} y2 @param {number} [from] */
function courses(d, x1, x2, y1, y2, from = 0) {
  for (let y = from; y <= y2; y += 218) if (y > y1 && y < y2) d.line([[x1, y], [x2, y]], 1.4)
  for (let y = from - 218; y > y1; y -= 218) if (y < y2) d.line([[x1, y], [x2, y]], 1.4)
}

// ---------------------------------------------------------------- junction drawings
/** @type {Record<string, (d: Drawing, p: Params) => string>} */
const junctions = {
  'ground-floor': (d, p) => {
    const L = layers(p)
    const top = -450
    const ground = p.variant === 'beam' ? 400 : 250
    const dpc = ground - 150
    const fTop = 750
    const fBot = 950
    const right = p.blk + 650
    // soil outside and under the floor
    d.rect(L.r0 - 450, ground, -130, fBot, FILLS.soil)
    if (p.variant === 'beam') d.rect(p.blk, 700, right, fBot, FILLS.soil)
    else d.rect(p.blk, 315, right, fBot, FILLS.soil)
    d.rect(-250, fTop, p.blk + 250, fBot, FILLS.concrete)
    d.rect(0, top, p.blk, fTop, FILLS.block)
    courses(d, 0, p.blk, top, fTop, fTop - 218)
    d.line([[0, fTop - 20], [p.blk, fTop - 20]], 0.6) // levelling course bed
    // ETICS and perimeter board
    etics(d, p, top, dpc)
    const perimBot = ground + (p.variant === 'upstand' ? 500 : 300)
    d.rect(-130, dpc + 3, -5, perimBot, FILLS.xps)
    d.rect(-138, dpc + 3, -130, perimBot, FILLS.render)
    d.poly([[L.r0 - 4, dpc], [0, dpc], [0, dpc + 3], [L.r0 - 4, dpc + 3]], FILLS.steel) // base track
    d.line([[-3, dpc], [p.blk + 3, dpc]], 2.4) // damp-proof course
    d.line([[L.r0 - 450, ground], [-138, ground]], 1.4)
    lining(d, p, top, 0)
    // floor
    if (p.variant === 'beam') {
      d.rect(p.blk, 0, right, 65, FILLS.plaster)
      d.rect(p.blk, 65, right, 165, FILLS[p.mat])
      d.rect(100, 165, right, 315, FILLS.concrete)
      d.rect(p.blk, 0, p.blk + 25, 165, FILLS[p.mat])
      d.note([p.blk + 330, 530], 'VENTILATED VOID', 9)
      d.label([p.blk + 200, 240], 'Precast beam and infill block deck bearing on the leaf', 'right')
      d.label([p.blk + 300, 115], 'Floor insulation over the deck, 25 mm perimeter upstand', 'right')
      d.airBarrier([[p.blk + 13, top], [p.blk + 13, 0], [right, 0]])
      d.dim([p.blk, 700], [p.blk, 315], -14, '385')
    } else {
      const edge = p.variant === 'upstand' ? p.blk + 50 : p.blk
      d.rect(p.blk, 0, right, 65, FILLS.plaster)
      d.rect(edge, 65, right, 215, FILLS.concrete)
      d.rect(p.blk, 215, right, 315, FILLS[p.mat])
      if (p.variant === 'upstand') {
        d.rect(p.blk, 0, edge, 215, FILLS[p.mat])
        d.label([p.blk + 25, 120], '50 mm insulated upstand at slab edge', 'right')
      }
      d.label([p.blk + 350, 140], 'Ground-bearing slab on polythene', 'right')
      d.label([p.blk + 420, 265], 'Floor insulation below slab', 'right')
      d.airBarrier([[p.blk + 13, top], [p.blk + 13, 0], [right, 0]])
    }
    d.label([-60, perimBot - 80], `Extruded perimeter board to ${perimBot - ground} mm below ground, no anchors below ground`, 'left')
    d.label([L.r0 - 2, dpc + 1], 'Base track about 150 mm above ground', 'left')
    d.label([p.blk / 2, dpc], 'Damp-proof course lapped to floor membrane', 'right')
    d.label([0, fBot - 100], 'Strip foundation, levelling course on general-purpose mortar', 'left')
    wallLabels(d, p, top + 80)
    wallDims(d, p, top + 10)
    d.dim([L.r0 - 300, ground], [L.r0 - 300, dpc], -12, '150')
    d.note([L.r0 - 250, top + 40], 'OUTSIDE', 10)
    d.note([p.blk + 380, top + 40], 'INSIDE', 10)
    d.note([p.blk + 560, -10], 'FFL', 8)
    return 'Section'
  },

  'plinth': (d, p) => {
    const L = layers(p)
    const top = -450
    const ground = 250
    const right = p.blk + 450
    d.rect(-260, 750, p.blk + 200, 900, FILLS.concrete)
    d.rect(0, top, p.blk, 750, FILLS.block)
    courses(d, 0, p.blk, top, 750, 750 - 218)
    d.rect(p.blk, 315, right, 900, FILLS.soil)
    d.rect(p.blk, 0, right, 65, FILLS.plaster)
    d.rect(p.blk, 65, right, 215, FILLS.concrete)
    d.rect(p.blk, 215, right, 315, FILLS[p.mat])
    lining(d, p, top, 0)
    d.line([[-3, ground - 150], [p.blk + 3, ground - 150]], 2.4)
    if (p.variant === 'paving') {
      const track = ground - 150
      etics(d, p, top, track)
      d.poly([[L.r0 - 4, track], [0, track], [0, track + 3], [L.r0 - 14, track + 3], [L.r0 - 14, track + 12], [L.r0 - 4, track + 12]], FILLS.steel)
      d.rect(L.r0 - 350, ground, -2, ground + 60, FILLS.concrete)
      d.rect(L.r0 - 350, ground + 60, -2, ground + 210, FILLS.gravel)
      d.rect(L.r0 - 350, ground + 210, -2, 900, FILLS.soil)
      d.line([[-2, track + 3], [-2, 750]], 2) // sealing slurry
      d.label([L.r0 - 10, track + 8], 'Base track with drip, 150 mm above paving', 'left')
      d.label([-2, ground + 120], 'Cementitious sealing slurry and paint on exposed blockwork', 'left')
      d.label([L.r0 - 200, ground + 30], 'Paving falling away from the wall', 'left')
      d.dim([L.r0 - 60, ground], [L.r0 - 60, track], -12, '150')
      d.airBarrier([[p.blk + 13, top], [p.blk + 13, 0], [right, 0]])
    } else {
      const change = ground - 300
      etics(d, p, top, change)
      d.rect(-125, change, -5, ground + 300, FILLS.xps)
      d.rect(-133, change, -125, ground + 300, FILLS.render)
      d.rect(-137, ground - 50, -133, ground + 300, FILLS.membrane)
      d.rect(-437, ground, -137, ground + 150, FILLS.gravel)
      d.rect(-700, ground, -437, 900, FILLS.soil)
      d.rect(-437, ground + 150, -137, 900, FILLS.soil)
      d.rect(-137, ground + 300, -5, 900, FILLS.soil)
      d.line([[-700, ground], [-137, ground]], 1.4)
      d.label([-65, change + 150], 'Extruded polystyrene perimeter board, bonded full-surface', 'left')
      d.label([-129, ground - 150], 'Double mesh in the splash zone, plinth render', 'left')
      d.label([-135, ground + 200], 'Dimpled membrane over sealing slurry below ground', 'left')
      d.label([-300, ground + 70], '300 mm gravel strip', 'left')
      d.dim([L.r0 - 80, ground], [L.r0 - 80, change], -12, '300')
      d.dim([-180, ground], [-180, ground + 300], 12, '300')
      d.airBarrier([[p.blk + 13, top], [p.blk + 13, 0], [right, 0]])
    }
    wallLabels(d, p, top + 60)
    wallDims(d, p, top + 10)
    d.note([L.r0 - 200, top + 40], 'OUTSIDE', 10)
    d.note([p.blk + 280, top + 40], 'INSIDE', 10)
    return 'Section'
  },

  'window-head': (d, p) => openingEdge(d, p, 'head'),
  'window-jamb': (d, p) => openingEdge(d, p, 'jamb'),

  'window-sill': (d, p) => {
    const L = layers(p)
    const bot = 550
    const zone = p.variant === 'zone'
    d.rect(0, 0, p.blk, bot, FILLS.block)
    courses(d, 0, p.blk, 0, bot, 218)
    lining(d, p, 25, bot)
    d.rect(70, 0, L.l1 + 30, 25, FILLS.timber) // window board
    if (zone) {
      d.rect(L.i0 + 20, 0, 0, 70, FILLS.dense)
      etics(d, p, 70, bot)
      d.rect(L.r0, 70, L.i0 + 20, 0, FILLS.white)
      d.rect(L.r0, 30, L.i0 + 20, 70, FILLS[p.mat])
      d.rect(L.r0 - 0, 70, L.i0, 30, FILLS.render)
      d.rect(-110, -70, -40, 0, FILLS.frame)
      d.rect(-40, -8, 70, 0, FILLS.membrane)
      d.line([[-75, -70], [-75, -260]], 1)
      d.line([[-65, -70], [-65, -260]], 1)
      d.poly([[-110, -30], [-110, -22], [L.r0 - 40, 10], [L.r0 - 40, 30], [L.r0 - 44, 30], [L.r0 - 44, 14], [-110, -14]], FILLS.steel)
      d.label([-75, -45], 'Frame in the insulation plane on brackets', 'right')
      d.label([(L.i0 + 20) / 2, 40], 'Load-bearing insulation sill board, bonded and screwed', 'left')
      d.label([-20, -4], 'Waterproof membrane dressed under the frame', 'right')
      d.airBarrier([[-40, -10], [70, -10], [70, 0], [L.l1 - 3, 0], [L.l1 - 3, bot]])
    } else {
      const underTop = (/** @type {number} */ x) => -12 + ((x - 0) / (L.r0 - 40)) * 30
      etics(d, p, 60, bot)
      d.poly([[L.r0, underTop(L.r0) + 6], [L.i0, underTop(L.i0) + 6], [L.i0, 60], [L.r0, 60]], FILLS.render)
      d.poly([[L.i0, underTop(L.i0) + 6], [-5, underTop(-5) + 6], [-5, 60], [L.i0, 60]], FILLS[p.mat])
      d.rect(0, -70, 70, 0, FILLS.frame)
      d.line([[35, -70], [35, -260]], 1)
      d.line([[45, -70], [45, -260]], 1)
      d.poly([[0, -28], [0, -20], [L.r0 - 40, underTop(L.r0 - 40)], [L.r0 - 40, underTop(L.r0 - 40) + 22], [L.r0 - 44, underTop(L.r0 - 44) + 22], [L.r0 - 44, underTop(L.r0 - 44) + 5], [0, -12]], FILLS.steel)
      d.rect(-3, -6, 70, 0, FILLS.membrane)
      d.label([35, -45], 'Window frame on the blockwork', 'right')
      d.label([L.i0 / 2, 35], 'Tapered insulation under the sill, 30 mm minimum', 'left')
      d.label([20, -3], 'Sub-sill membrane lapped up the jambs 100 mm', 'right')
      d.airBarrier([[0, -10], [70, -10], [70, 0], [L.l1 - 3, 0], [L.l1 - 3, bot]])
    }
    d.label([L.r0 - 40, 12], 'Pressed metal sill, 5° fall, 40 mm drip projection, end caps in sealing tape', 'left')
    d.label([L.l1 + 10, 12], 'Window board', 'right')
    wallLabels(d, p, 200)
    wallDims(d, p, bot - 20)
    d.dim([L.r0 - 44, 40], [L.r0, 40], -12, '40')
    d.note([L.r0 - 120, -200], 'OUTSIDE', 10)
    d.note([p.blk + 120, -200], 'INSIDE', 10)
    return 'Section'
  },

  'door-threshold': (d, p) => {
    const right = p.blk + 600
    d.rect(-260, 750, p.blk + 200, 900, FILLS.concrete)
    d.rect(0, 80, p.blk, 750, FILLS.block)
    courses(d, 0, p.blk, 80, 750, 750 - 218)
    d.rect(0, 0, p.blk - 60, 80, FILLS.dense)
    d.rect(p.blk - 60, 0, p.blk, 80, FILLS[p.mat])
    d.rect(0, -30, 90, 0, FILLS.frame)
    d.rect(20, -420, 60, -30, FILLS.timber)
    d.rect(p.blk, 0, right, 65, FILLS.plaster)
    d.rect(p.blk + 50, 65, right, 215, FILLS.concrete)
    d.rect(p.blk, 65, p.blk + 50, 215, FILLS[p.mat])
    d.rect(p.blk, 215, right, 315, FILLS[p.mat])
    d.rect(p.blk, 315, right, 900, FILLS.soil)
    d.rect(-125, 60, -5, 550, FILLS.xps)
    d.rect(-133, 60, -125, 550, FILLS.render)
    // drainage channel with grating
    d.poly([[-260, 15], [-140, 15], [-140, 150], [-260, 150]], FILLS.concrete)
    d.poly([[-250, 15], [-150, 15], [-150, 130], [-250, 130]], FILLS.white)
    d.rect(-255, 10, -145, 15, FILLS.steel)
    d.poly([[-700, 30], [-260, 15], [-260, 70], [-700, 85]], FILLS.concrete)
    d.rect(-700, 85, -260, 900, FILLS.soil)
    d.rect(-260, 150, -133, 900, FILLS.soil)
    d.rect(-133, 550, 0, 900, FILLS.soil)
    d.line([[-3, 0], [-3, 200], [-125, 200]], 2.2) // membrane under the frame down the board
    d.label([45, -200], 'Door leaf', 'right')
    d.label([45, -15], 'Level threshold frame', 'right')
    d.label([(p.blk - 60) / 2, 40], 'Load-bearing insulation block under the frame', 'left')
    d.label([-200, 80], 'Linear drainage channel and grating, 15 mm max below threshold', 'left')
    d.label([-500, 50], 'Paving falling away from the door', 'left')
    d.label([-65, 400], 'Perimeter board below paving', 'left')
    d.label([-60, 200], 'Waterproof membrane from frame down the board 150 mm', 'left')
    d.label([p.blk + 25, 150], '50 mm slab-edge upstand', 'right')
    d.label([p.blk + 350, 140], 'Ground-bearing slab', 'right')
    d.label([p.blk + 350, 265], 'Floor insulation', 'right')
    d.label([p.blk / 2, 500], `${p.blk} mm blockwork below the threshold`, 'right')
    d.airBarrier([[90, -12], [p.blk, -12], [p.blk, 0], [right, 0]])
    d.dim([-260, 10], [-260, 0], 16, '15 max')
    d.dim([0, 600], [p.blk, 600], 14, String(p.blk))
    d.note([-450, -350], 'OUTSIDE', 10)
    d.note([p.blk + 350, -350], 'INSIDE', 10)
    return 'Section'
  },

  'eaves': (d, p) => {
    const L = layers(p)
    const bot = 700
    const tan = Math.tan((30 * Math.PI) / 180)
    const seatX = p.blk
    const seatY = p.variant === 'warm' ? -60 : -230
    const yr = (/** @type {number} */ x) => seatY + (seatX - x) * tan // rafter underside
    const xe = L.r0 - 300
    const xr = p.blk + 480
    const depth = 170 / Math.cos((30 * Math.PI) / 180)
    d.rect(0, 0, p.blk, bot, FILLS.block)
    courses(d, 0, p.blk, 0, bot, 218)
    d.rect(40, -50, 140, 0, FILLS.timber) // wall plate
    const soffit = yr(xe)
    etics(d, p, soffit + 10, bot)
    d.rect(xe, soffit, L.r0, soffit + 10, FILLS.timber) // soffit board
    d.poly([[xe, yr(xe)], [xr, yr(xr)], [xr, yr(xr) - depth], [xe, yr(xe) - depth]], FILLS.timber) // rafter
    d.poly([[xe - 20, yr(xe) - depth - 10], [xe, yr(xe) - depth - 10], [xe, soffit + 10], [xe - 20, soffit + 10]], FILLS.timber) // fascia
    d.line([[xe - 40, yr(xe - 40) - depth - 35], [xr, yr(xr) - depth - 35]], 2.5) // tiles and battens
    if (p.variant === 'warm') {
      // insulation between and under the rafters, membrane and board under it
      d.poly([[0, yr(0) - depth + 30], [xr, yr(xr) - depth + 30], [xr, yr(xr) + 60], [0, yr(0) + 60]], FILLS[p.mat], { sw: 0.6 })
      d.poly([[L.r0, soffit + 10], [0, soffit + 10], [0, yr(0) + 60], [L.r0, yr(0) + 60]], FILLS[p.mat], { sw: 0.6 })
      d.poly([[p.blk + 13, yr(p.blk + 13) + 60], [xr, yr(xr) + 60], [xr, yr(xr) + 73], [p.blk + 13, yr(p.blk + 13) + 73]], FILLS.plaster)
      lining(d, p, yr(p.blk) + 70, bot)
      d.airBarrier([[p.blk + 13, bot], [p.blk + 13, yr(p.blk + 13) + 60], [xr, yr(xr) + 60]])
      d.label([xr - 150, yr(xr - 150) - 40], 'Insulation between and under rafters', 'right')
      d.label([xr - 100, yr(xr - 100) + 62], 'Airtight membrane taped to the blockwork, plasterboard', 'right')
      d.label([L.r0 / 2, soffit - 40], 'Roof insulation overlapping the wall insulation', 'left')
      d.dim([L.r0 - 20, soffit + 10], [L.r0 - 20, yr(0) + 60], 14)
    } else {
      const xTop = seatX + (seatY + 25 + 350) / tan
      d.rect(p.blk + 13, -50, xr, -37, FILLS.plaster) // ceiling board
      d.poly([[0, -50], [0, yr(0) + 25], [Math.min(xTop, xr), -350], [xr, -350], [xr, -50]], FILLS[p.mat], { sw: 0.6 })
      d.line([[-30, yr(-30) + 25], [Math.min(xTop, xr), yr(Math.min(xTop, xr)) + 25]], 1.2, '2 2')
      d.rect(0, -50, 40, 0, FILLS[p.mat])
      // wall insulation carried above the soffit, unrendered, to meet the loft insulation under the tray
      d.poly([[L.i0, soffit + 10], [L.i0, yr(L.i0) + 25], [L.i1, yr(L.i1) + 25], [L.i1, soffit + 10]], FILLS[p.mat])
      d.label([(L.i0 + L.i1) / 2, (soffit + yr(L.i0)) / 2], 'Wall insulation carried above the soffit to meet the loft insulation', 'left')
      lining(d, p, -37, bot)
      d.airBarrier([[p.blk + 13, bot], [p.blk + 13, -37], [xr, -37]])
      d.label([p.blk + 360, -200], 'Loft insulation over the ceiling and the wall head', 'right')
      d.label([Math.min(xTop, xr) - 100, yr(Math.min(xTop, xr) - 100) + 25], 'Eaves ventilation tray', 'right')
      d.label([p.blk + 420, -43], 'Ceiling air barrier sealed to the wall plaster', 'right')
      d.dim([xr - 40, -350], [xr - 40, -50], -14, '300')
    }
    d.label([90, -25], 'Wall plate strapped down to the blockwork', 'right')
    d.label([xe + 60, soffit + 5], 'Soffit; ETICS stops 10 mm below with stop bead and sealing tape', 'left')
    d.label([xe + 120, yr(xe + 120) - depth / 2], 'Rafter', 'left')
    wallLabels(d, p, 380)
    wallDims(d, p, bot - 20)
    d.note([L.r0 - 200, bot - 80], 'OUTSIDE', 10)
    d.note([p.blk + 350, bot - 80], 'INSIDE', 10)
    return 'Section'
  },

  'verge': (d, p) => {
    const L = layers(p)
    const bot = 500
    const warm = p.variant === 'warm'
    const wallTop = warm ? -150 : -800
    const xe = L.r0 - 120
    const xr = p.blk + 700
    d.rect(0, wallTop, p.blk, bot, FILLS.block)
    courses(d, 0, p.blk, wallTop, bot, 218)
    etics(d, p, wallTop + 10, bot)
    d.rect(xe, wallTop, L.r0, wallTop + 10, FILLS.timber) // verge soffit board
    d.rect(xe - 20, wallTop - 200, xe, wallTop + 10, FILLS.timber) // barge board
    d.line([[xe - 30, wallTop - 190], [xr, wallTop - 190]], 2.5) // tiles
    d.rect(xe, wallTop - 175, xr, wallTop - 155, FILLS.timber) // battens line
    d.line([[xe, wallTop - 152], [xr, wallTop - 152]], 0.8, '4 2') // underlay
    if (warm) {
      d.rect(p.blk, -150, p.blk + 50, 50, FILLS.mw)
      for (let x = p.blk + 50; x < xr - 60; x += 400) d.rect(x, -150, x + 50, 0, FILLS.timber)
      d.rect(p.blk + 100, -150, xr, 0, FILLS[p.mat])
      for (let x = p.blk + 450; x < xr - 60; x += 400) d.rect(x - 350, -150, x, 0, FILLS[p.mat])
      d.rect(p.blk, 0, xr, 50, FILLS[p.mat])
      d.rect(p.blk + 13, 50, xr, 62.5, FILLS.plaster)
      lining(d, p, 62.5, bot)
      d.rect(0, wallTop - 5, p.blk + 50, wallTop, FILLS.mw)
      d.airBarrier([[p.blk + 13, bot], [p.blk + 13, 50], [xr, 50]])
      d.label([p.blk + 25, -60], 'Flexible insulation between the last rafter and the gable', 'right')
      d.label([p.blk + 300, -75], 'Insulation between and under rafters', 'right')
      d.label([p.blk + 400, 52], 'Roof membrane taped to the gable, plasterboard', 'right')
      d.dim([p.blk, 200], [p.blk + 50, 200], -14, '50')
    } else {
      for (let x = p.blk + 20; x < xr - 60; x += 400) d.rect(x, -150, x + 47, 0, FILLS.timber)
      d.rect(p.blk, -300, xr, 0, FILLS[p.mat], { sw: 0.6 })
      for (let x = p.blk + 20; x < xr - 60; x += 400) d.rect(x, -150, x + 47, 0, FILLS.timber)
      d.rect(p.blk + 13, 0, xr, 12.5, FILLS.plaster)
      for (let x = p.blk + 100; x < xr; x += 450) d.rect(x, wallTop - 150, x + 50, wallTop - 10, FILLS.timber)
      lining(d, p, 12.5, bot)
      d.airBarrier([[p.blk + 13, bot], [p.blk + 13, 12.5], [xr, 12.5]])
      d.note([p.blk + 350, -550], 'COLD LOFT', 9)
      d.label([p.blk + 300, -230], 'Loft insulation tight to the gable', 'right')
      d.label([p.blk + 400, 8], 'Ceiling air barrier sealed to the gable plaster', 'right')
      d.label([p.blk / 2, -450], 'Gable blockwork above the ceiling, restraint straps to roof', 'right')
      d.dim([xr - 30, -300], [xr - 30, 0], -14, '300')
    }
    d.label([xe + 40, wallTop + 5], 'Verge soffit; ETICS stop bead and sealing tape', 'left')
    d.label([xe - 10, wallTop - 100], 'Barge board', 'left')
    d.label([xe + 100, wallTop - 190], 'Tiles, battens and underlay', 'left')
    wallLabels(d, p, warm ? 220 : -200)
    wallDims(d, p, bot - 20)
    d.note([L.r0 - 120, bot - 60], 'OUTSIDE', 10)
    d.note([p.blk + 350, bot - 60], 'INSIDE', 10)
    return 'Section'
  },

  'intermediate-floor': (d, p) => {
    const L = layers(p)
    const top = -550
    const bot = 650
    const xr = p.blk + 600
    d.rect(0, top, p.blk, bot, FILLS.block)
    courses(d, 0, p.blk, top, bot, 0)
    if (p.variant === 'slab') {
      d.rect(100, 0, xr, 225, FILLS.concrete)
      d.rect(p.blk, -65, xr, 0, FILLS.plaster)
      etics(d, p, top, 12)
      etics(d, p, 12, 212, 'mw')
      etics(d, p, 212, bot)
      lining(d, p, top, -65)
      lining(d, p, 225, bot)
      d.line([[-3, 12], [L.r0 - 3, 12]], 0.6)
      d.airBarrier([[p.blk + 2, top], [p.blk + 2, -65], [xr, -65]])
      d.airBarrier([[xr, 225], [p.blk + 2, 225], [p.blk + 2, bot]])
      d.label([(L.i0 + L.i1) / 2, 110], '200 mm non-combustible mineral wool fire barrier, bonded full-surface and anchored', 'left')
      d.label([p.blk + 300, 110], 'Concrete floor slab bearing on the leaf', 'right')
      d.label([p.blk + 350, -35], 'Screed', 'right')
      d.dim([L.r0 - 20, 12], [L.r0 - 20, 212], -14, '200')
      d.dim([100, 260], [p.blk, 260], -14, 'bearing')
      d.note([L.r0 - 260, bot - 20], 'Fire: confirm with a fire engineer', 8, 'start')
    } else {
      etics(d, p, top, bot)
      lining(d, p, top, bot)
      d.rect(p.blk + 13, 0, xr, 22, FILLS.timber)
      d.rect(p.blk + 18, 22, xr, 247, FILLS.timber)
      d.rect(p.blk + 13, 247, xr, 260, FILLS.plaster)
      d.poly([[p.blk - 30, -6], [p.blk + 16, -6], [p.blk + 16, 250], [p.blk + 60, 250], [p.blk + 60, 254], [p.blk + 12, 254], [p.blk + 12, -2], [p.blk - 30, -2]], FILLS.steel)
      d.airBarrier([[p.blk + 8, top], [p.blk + 8, bot]])
      d.label([p.blk + 30, 252], 'Joist hanger for thin-joint masonry, top built into the bed joint', 'right')
      d.label([p.blk + 300, 130], 'Timber floor joist', 'right')
      d.label([p.blk + 300, 10], 'Floor deck', 'right')
      d.label([p.blk + 300, 254], 'Ceiling board', 'right')
      d.dim([xr - 30, 22], [xr - 30, 247], -14, '225')
    }
    wallLabels(d, p, top + 100)
    wallDims(d, p, top + 10)
    d.note([L.r0 - 120, top + 40], 'OUTSIDE', 10)
    d.note([p.blk + 350, top + 40], 'INSIDE', 10)
    return 'Section'
  },

  'party-wall': (d, p) => {
    const L = layers(p)
    const y0 = -650
    const y1 = 650
    const xr = p.blk + 900
    const pw = 215
    d.rect(0, y0, p.blk, y1, FILLS.block)
    d.rect(p.blk, -pw / 2, xr, pw / 2, p.variant === 'mw' ? FILLS.dense : FILLS.dense)
    if (p.variant === 'mw') {
      etics(d, p, y0, y1)
    } else {
      etics(d, p, y0, -100)
      etics(d, p, -100, 100, 'mw')
      etics(d, p, 100, y1)
      d.dim([L.r0 - 20, -100], [L.r0 - 20, 100], -14, '200')
      d.label([(L.i0 + L.i1) / 2, 0], 'Vertical non-combustible mineral wool strip in line with the party wall', 'left')
    }
    const lin = p.lining === 'dry' ? 27.5 : PLASTER
    d.rect(p.blk, y0, p.blk + lin, -pw / 2, FILLS.plaster)
    d.rect(p.blk, pw / 2, p.blk + lin, y1, FILLS.plaster)
    d.rect(p.blk + lin, -pw / 2 - lin, xr, -pw / 2, FILLS.plaster)
    d.rect(p.blk + lin, pw / 2, xr, pw / 2 + lin, FILLS.plaster)
    for (const y of [-60, 60]) d.line([[p.blk / 2, y], [p.blk + 120, y]], 1.4, '5 2') // ties
    d.poly([[p.blk + lin, -pw / 2 - lin], [p.blk + lin + 8, -pw / 2 - lin], [p.blk + lin, -pw / 2 - lin - 8]], FILLS.membrane)
    d.poly([[p.blk + lin, pw / 2 + lin], [p.blk + lin + 8, pw / 2 + lin], [p.blk + lin, pw / 2 + lin + 8]], FILLS.membrane)
    d.airBarrier([[p.blk + 4, y0], [p.blk + 4, -pw / 2 - 4], [xr, -pw / 2 - 4]])
    d.airBarrier([[xr, pw / 2 + 4], [p.blk + 4, pw / 2 + 4], [p.blk + 4, y1]])
    d.label([p.blk + 500, 0], 'Separating wall to the acoustic and fire design', 'right')
    d.label([p.blk + 80, 60], 'Ties for thin-joint masonry', 'right')
    d.label([p.blk + lin + 3, pw / 2 + lin + 3], p.variant === 'mw' ? 'Fire-stopping sealant behind the dry lining' : 'Flexible sealant where plaster coats meet', 'right')
    wallLabels(d, p, -520)
    d.dim([p.blk + 700, -pw / 2], [p.blk + 700, pw / 2], -14, String(pw))
    wallDims(d, p, y1 - 20)
    const unit = p.variant === 'mw' ? 'APARTMENT' : 'HOUSE'
    d.note([p.blk + 500, -350], `${unit} A`, 10)
    d.note([p.blk + 500, 380], `${unit} B`, 10)
    d.note([L.r0 - 150, -350], 'OUTSIDE', 10)
    d.note([p.blk + 500, y1 - 40], 'PLAN', 9)
    return 'Plan'
  },

  'external-corner': (d, p) => {
    const T = RENDER + p.ins + ADHESIVE + p.blk + PLASTER
    const X0 = 0
    const Y0 = 0
    const end = T + 900
    const band = (/** @type {number} */ a, /** @type {number} */ b, /** @type {string} */ fill) =>
      d.poly([[X0 + a, end], [X0 + a, Y0 + a], [end, Y0 + a], [end, Y0 + b], [X0 + b, Y0 + b], [X0 + b, end]], fill)
    const iA = RENDER
    const iB = RENDER + p.ins
    const bA = iB + ADHESIVE
    const bB = bA + p.blk
    band(0, iA, FILLS.render)
    band(iA, iB, FILLS[p.mat])
    band(iB, bA, FILLS.white)
    band(bA, bB, FILLS.block)
    band(bB, T, FILLS.plaster)
    d.line([[iA, iB], [iB, iB]], 1.6) // board toothing joint in this course
    d.line([[bA + 440, bA], [bA + 440, bB]], 1.4) // perpend
    d.line([[bA, bB], [bB, bB]], 1.4)
    d.poly([[-4, 60], [-4, -4], [60, -4], [60, 0], [0, 0], [0, 60]], FILLS.steel) // corner bead
    d.airBarrier([[T - 4, end], [T - 4, T - 4], [end, T - 4]])
    d.label([-3, 30], 'Corner bead with mesh wings, plumb ±2 mm per storey', 'left')
    d.label([(iA + iB) / 2, 400], `${p.ins} mm ${MAT_TEXT[p.mat]}`, 'left')
    d.label([(iA + iB) / 2, (iA + iB) / 2 + 20], 'Boards toothed in alternate courses', 'left')
    d.label([(bA + bB) / 2, 600], `${p.blk} mm lightweight aggregate-concrete block, bonded at the corner`, 'left')
    d.label([500, iA / 2], 'Base coat with mesh lapped 100 mm onto the bead, render finish', 'right')
    d.label([700, T - 6], '13 mm gypsum plaster (air barrier)', 'right')
    d.dim([0, end - 40], [iB, end - 40], 14, String(p.ins))
    d.dim([bA, end - 40], [bB, end - 40], 14, String(p.blk))
    d.dim([end - 40, 0], [end - 40, iB], -14, String(p.ins))
    d.note([-150, -150], 'OUTSIDE', 10)
    d.note([T + 400, T + 450], 'INSIDE', 10)
    d.note([T + 400, T + 550], 'PLAN', 9)
    return 'Plan'
  },

  'internal-corner': (d, p) => {
    const T = RENDER + p.ins + ADHESIVE + p.blk + PLASTER
    const X0 = 0
    const Y0 = 0
    const end = 1000
    const band = (/** @type {number} */ a, /** @type {number} */ b, /** @type {string} */ fill) =>
      d.poly([[X0 - a, end], [X0 - a, Y0 - a], [end, Y0 - a], [end, Y0 - b], [X0 - b, Y0 - b], [X0 - b, end]], fill)
    const iA = RENDER
    const iB = RENDER + p.ins
    const bA = iB + ADHESIVE
    const bB = bA + p.blk
    band(0, iA, FILLS.render)
    band(iA, iB, FILLS[p.mat])
    band(iB, bA, FILLS.white)
    band(bA, bB, FILLS.block)
    band(bB, T, FILLS.plaster)
    d.line([[-iA, -iA], [-iB, -iA]], 1.6) // board butt joint: the top wall's boards run through
    d.line([[-bA, -bA], [-bB, -bA]], 1.4)
    d.line([[-3, 100], [-3, -3], [100, -3]], 1.2, '3 2') // mesh round the corner
    d.airBarrier([[-(T - 4), end], [-(T - 4), -(T - 4)], [end, -(T - 4)]])
    d.label([-iA / 2, 300], 'Base coat with mesh carried 100 mm round the corner from each side', 'left')
    d.label([-(iA + iB) / 2, 500], `${p.ins} mm ${MAT_TEXT[p.mat]}`, 'left')
    d.label([-(iA + iB) / 2 + 20, -(iA + iB) / 2], 'Boards butted; gaps up to 5 mm foamed and rasped', 'left')
    d.label([-(bA + bB) / 2, 700], `${p.blk} mm lightweight aggregate-concrete block, tied or bonded`, 'left')
    d.label([700, -(T - 6)], '13 mm gypsum plaster (air barrier)', 'right')
    d.label([500, -iA / 2], 'Render finish, corner trowelled', 'right')
    d.dim([-iB, end - 40], [0, end - 40], 14, String(p.ins))
    d.dim([-bB, end - 40], [-bA, end - 40], 14, String(p.blk))
    d.dim([end - 40, -100], [end - 40, 0], -14, '100')
    d.note([500, 400], 'OUTSIDE', 10)
    d.note([-T - 200, -T - 200], 'INSIDE', 10)
    d.note([500, 500], 'PLAN', 9)
    return 'Plan'
  },

  'balcony': (d, p) => {
    const L = layers(p)
    const top = -500
    const bot = 650
    const xr = p.blk + 450
    const xb = L.r0 - 650
    d.rect(0, top, p.blk, bot, FILLS.block)
    courses(d, 0, p.blk, top, bot, 0)
    d.rect(100, 0, xr, 225, FILLS.concrete)
    d.rect(p.blk, -65, xr, 0, FILLS.plaster)
    d.rect(L.i0 - 8, 0, 0, 225, FILLS.dense) // thermal break body
    for (const y of [40, 185]) d.line([[L.i0 - 150, y], [300, y]], 2.2)
    d.line([[L.i0 - 150, 110], [200, 150]], 1.6)
    d.poly([[xb, 20], [L.i0 - 8, 0], [L.i0 - 8, 210], [xb, 210]], FILLS.concrete)
    d.poly([[xb, 14], [L.i0 - 8, -6], [L.i0 - 8, 0], [xb, 20]], FILLS.membrane)
    etics(d, p, top, -200)
    etics(d, p, -200, 0, 'mw')
    etics(d, p, 225, 425, 'mw')
    etics(d, p, 425, bot)
    lining(d, p, top, -65)
    lining(d, p, 225, bot)
    d.rect(xb + 50, -700, xb + 70, 14, FILLS.steel) // railing post
    d.airBarrier([[p.blk + 2, top], [p.blk + 2, -65], [xr, -65]])
    d.airBarrier([[xr, 225], [p.blk + 2, 225], [p.blk + 2, bot]])
    d.label([(L.i0 - 8) / 2, 110], 'Structural thermal break element in the insulation plane', 'left')
    d.label([xb + 250, 100], 'Cantilever balcony slab, falling away at 1 in 80', 'left')
    d.label([(L.i0 + L.i1) / 2, -100], 'Mineral wool fire barrier above and below the slab', 'left')
    d.label([xb + 60, -450], 'Balustrade (by others)', 'left')
    d.label([200, 40], 'Bars through the break element, as the structural design', 'right')
    d.label([p.blk + 300, 110], 'Floor slab', 'right')
    d.note([xb, 560], 'Structure and fire: confirm with engineers', 8, 'start')
    wallLabels(d, p, top + 80)
    wallDims(d, p, bot - 20)
    d.dim([L.i0 - 8, 260], [0, 260], -14)
    d.note([xb + 250, top + 40], 'OUTSIDE', 10)
    d.note([p.blk + 250, top + 40], 'INSIDE', 10)
    return 'Section'
  },

  'service-penetration': (d, p) => {
    const L = layers(p)
    const top = -500
    const bot = 500
    d.rect(0, top, p.blk, bot, FILLS.block)
    courses(d, 0, p.blk, top, bot, 109)
    etics(d, p, top, bot)
    lining(d, p, top, bot)
    if (p.variant === 'block') {
      d.rect(L.i0, -120, L.i1, 120, FILLS.dense)
      d.rect(L.r0 - 12, -150, L.r0, 150, FILLS.steel)
      for (const y of [-90, 90]) d.rect(L.r0 - 22, y - 4, L.i1 - 10, y + 4, FILLS.steel)
      d.rect(L.r0 - 30, -20, 60, 20, FILLS.steel)
      d.label([(L.i0 + L.i1) / 2, 60], 'High-density insulating mounting block, bonded and anchored', 'left')
      d.label([L.r0 - 6, -140], 'Bracket plate of the item fixed (by others)', 'left')
      d.label([L.r0 - 20, 90], 'Screws into the mounting block, holes sealed', 'left')
      d.label([40, 0], 'Through-fixing with thermal separator for heavy loads', 'right')
      d.dim([L.i0 - 30, -120], [L.i0 - 30, 120], 14, '240')
      d.note([L.r0 - 250, 380], 'Loads: confirm with a competent designer', 8, 'start')
    } else {
      const fall = Math.tan((5 * Math.PI) / 180)
      const xo = L.r0 - 90
      const xi = p.blk + 120
      const yc = (/** @type {number} */ x) => -(x - xo) * fall // falls outward
      const band = (/** @type {number} */ r, /** @type {number} */ x1, /** @type {number} */ x2, /** @type {string} */ fill) =>
        d.poly([[x1, yc(x1) - r], [x2, yc(x2) - r], [x2, yc(x2) + r], [x1, yc(x1) + r]], fill)
      band(70, L.r0, L.l1, FILLS.white)
      band(62, L.r0 + 2, p.blk, FILLS.frame)
      band(55, xo, xi, FILLS.white)
      d.poly([[L.r0 - 10, yc(L.r0) - 75], [L.r0, yc(L.r0) - 75], [L.r0, yc(L.r0) + 75], [L.r0 - 10, yc(L.r0) + 75]], FILLS.membrane)
      d.poly([[L.l1, yc(L.l1) - 80], [L.l1 + 8, yc(L.l1) - 80], [L.l1 + 8, yc(L.l1) + 80], [L.l1, yc(L.l1) + 80]], FILLS.membrane)
      d.label([(xo + L.r0) / 2, yc(L.r0)], 'Pipe or duct', 'left')
      d.label([L.r0 - 5, yc(L.r0) + 70], 'Sealing collar and flexible sealant at the render face', 'left')
      d.label([p.blk / 2, yc(p.blk / 2) - 62], 'Sleeve falling 5° outward, annulus filled with mortar', 'right')
      d.label([L.l1 + 4, yc(L.l1) + 75], 'Airtight grommet on the room side, plastered over', 'right')
      d.label([(L.i0 + L.i1) / 2, yc(L.i0) - 65], 'Board cut to within 5 mm, low-expansion foam', 'left')
      d.dim([L.l1 + 40, yc(L.l1 + 40) - 55], [L.l1 + 40, yc(L.l1 + 40) + 55], -14, 'Ø 110')
    }
    d.airBarrier([[p.blk + 6, top], [p.blk + 6, bot]])
    wallLabels(d, p, top + 60)
    wallDims(d, p, bot - 20)
    d.note([L.r0 - 120, bot - 30], 'OUTSIDE', 10)
    d.note([p.blk + 150, bot - 30], 'INSIDE', 10)
    return 'Section'
  },

  'movement-joint': (d, p) => {
    const L = layers(p)
    const y0 = -550
    const y1 = 550
    d.rect(0, y0, p.blk, -5, FILLS.block)
    d.rect(0, 5, p.blk, y1, FILLS.block)
    d.rect(0, -5, p.blk - 25, 5, FILLS.filler)
    d.rect(p.blk - 25, -5, p.blk, 5, FILLS.white)
    d.poly([[p.blk - 18, -5], [p.blk - 3, -5], [p.blk - 3, 5], [p.blk - 18, 5]], FILLS.frame)
    etics(d, p, y0, -5)
    etics(d, p, 5, y1)
    d.rect(L.i0, -5, L.i1, 5, FILLS.filler)
    // joint profile with a loop, mesh wings either side
    d.line([[L.r0 - 1, -60], [L.r0 - 1, -6], [L.r0 - 14, -6], [L.r0 - 14, 6], [L.r0 - 1, 6], [L.r0 - 1, 60]], 1.6)
    d.rect(p.blk, y0, p.blk + PLASTER, -10, FILLS.plaster)
    d.rect(p.blk, 10, p.blk + PLASTER, y1, FILLS.plaster)
    d.rect(p.blk, -12, p.blk + PLASTER + 2, -9, FILLS.steel)
    d.rect(p.blk, 9, p.blk + PLASTER + 2, 12, FILLS.steel)
    d.rect(p.blk + 2, -9, p.blk + PLASTER, 9, FILLS.membrane)
    d.line([[60, -150], [60, 150]], 1.4, '5 2') // movement-joint tie in a bed joint
    d.airBarrier([[p.blk + 6, y0], [p.blk + 6, -12]])
    d.airBarrier([[p.blk + 6, 12], [p.blk + 6, y1]])
    d.label([L.r0 - 14, 0], 'ETICS joint profile over the blockwork joint, mesh lapped 100 mm onto its wings', 'left')
    d.label([(L.i0 + L.i1) / 2, 0], 'Compressible strip in the insulation joint', 'left')
    d.label([p.blk / 2, 0], 'Compressible non-combustible filler', 'right')
    d.label([p.blk + 8, 0], 'Sealant over backing rod, plaster stop beads each side', 'right')
    d.label([60, 120], 'Movement-joint tie, sleeved one end', 'right')
    wallLabels(d, p, y0 + 80)
    d.dim([p.blk + 60, -5], [p.blk + 60, 5], -14, '10')
    wallDims(d, p, y1 - 20)
    d.note([L.r0 - 150, y1 - 60], 'OUTSIDE', 10)
    d.note([p.blk + 200, y1 - 60], 'INSIDE', 10)
    d.note([p.blk + 200, y0 + 60], 'PLAN', 9)
    return 'Plan'
  },
}

/**
 * Head (section) and jamb (plan) share one geometry: the wall runs to an opening edge at y = 0.
 * @param {Drawing} d @param {Params} p @param {'head' | 'jamb'} kind
 */
function openingEdge(d, p, kind) {
  const L = layers(p)
  const top = -520
  const zone = p.variant === 'zone'
  const overlap = zone ? 40 : 30
  d.rect(0, top, p.blk, 0, FILLS.block)
  if (kind === 'head') {
    d.rect(0, -215, p.blk, 0, FILLS.concrete) // lintel
    courses(d, 0, p.blk, top, -215, -215)
    d.label([p.blk / 2, -110], 'Precast concrete lintel, bearing as the structural design', 'right')
  } else {
    d.line([[0, -220], [p.blk, -220]], 1.4)
    d.line([[p.blk / 2, -440], [p.blk / 2, -220]], 1.4)
  }
  const fx0 = zone ? -90 : 0
  const fx1 = fx0 + 70
  etics(d, p, top, 0)
  d.rect(L.r0, 0, fx0, overlap, FILLS.render) // render return to frame
  d.rect(L.i0 + 0, 0, fx0, overlap - 8, FILLS[p.mat])
  d.rect(L.r0, overlap - 8, fx0, overlap, FILLS.render)
  d.rect(L.r0, 0, L.i0, overlap, FILLS.render)
  d.rect(fx0, 0, fx1, 70, FILLS.frame)
  d.line([[fx0 + 30, 70], [fx0 + 30, 260]], 1)
  d.line([[fx0 + 40, 70], [fx0 + 40, 260]], 1)
  d.poly([[L.r0 - 6, overlap + 6], [L.r0, overlap + 6], [L.r0, overlap], [L.r0 + 6, overlap], [L.r0 + 6, overlap + 2], [L.r0 - 6, overlap + 2]], FILLS.steel) // bead
  d.rect(fx0 - 6, overlap - 8, fx0, overlap, FILLS.steel) // connection profile
  if (zone) {
    d.rect(-20, 0, 0, 70, FILLS.dense)
    d.poly([[-60, 70], [-60, 80], [60, 80], [60, 74], [-54, 74], [-54, 70]], FILLS.steel) // bracket
    d.rect(-20, -4, fx1 + 10, 0, FILLS.membrane)
  } else {
    d.rect(-3, 0, 0, 70, FILLS.membrane)
  }
  // inner reveal lining
  d.rect(Math.max(fx1, 0), 0, p.blk, PLASTER, FILLS.plaster)
  lining(d, p, top, PLASTER)
  d.airBarrier([[L.l1 - 3, top], [L.l1 - 3, PLASTER + 3], [fx1, PLASTER + 3]])
  const edge = kind === 'head' ? 'head' : 'jamb'
  d.label([fx0 + 35, 45], zone ? 'Frame in the insulation plane on brackets' : 'Frame fixed at the outer face of the blockwork', 'right')
  d.label([zone ? 0 : -1, zone ? -2 : 35], zone ? 'Airtight membrane from frame to blockwork' : 'Airtight tape from frame to blockwork', 'right')
  d.label([fx0 - 3, overlap - 4], 'Frame connection profile with mesh wing', 'left')
  d.label([L.r0 - 3, overlap + 4], kind === 'head' ? 'Drip bead at the head arris' : 'Corner bead with mesh wings', 'left')
  d.label([(L.i0 + fx0) / 2, overlap - 12], `Insulation over the frame ${edge} by ${overlap} mm`, 'left')
  d.label([(fx1 + p.blk) / 2, PLASTER / 2], 'Plaster returned into the reveal to the frame', 'right')
  if (zone) d.label([30, 77], 'Window bracket fixed to the blockwork', 'right')
  wallLabels(d, p, top + 100)
  wallDims(d, p, top + 20)
  d.dim([L.r0 - 30, 0], [L.r0 - 30, overlap], -12, String(overlap))
  d.note([L.r0 - 100, 230], 'OUTSIDE', 10)
  d.note([p.blk + 120, 230], 'INSIDE', 10)
  if (kind === 'jamb') d.note([p.blk + 120, 265], 'PLAN', 9)
  return kind === 'head' ? 'Section' : 'Plan'
}

// ---------------------------------------------------------------- per-detail parameters
/** @type {Record<string, Partial<Params>>} */
const PARAMS = {
  'D-GRD-01': { variant: 'slab' },
  'D-GRD-02': { variant: 'beam' },
  'D-GRD-03': { variant: 'upstand' },
  'D-PLN-01': { variant: 'buried' },
  'D-PLN-02': { blk: 140, ins: 200, mat: 'eps', variant: 'paving' },
  'D-WIN-01': { variant: 'face' },
  'D-WIN-02': { ins: 180, variant: 'zone' },
  'D-WIN-03': { variant: 'face' },
  'D-WIN-04': { ins: 180, variant: 'zone' },
  'D-WIN-05': { variant: 'face' },
  'D-WIN-06': { ins: 180, variant: 'zone' },
  'D-DOR-01': {},
  'D-EAV-01': { variant: 'cold' },
  'D-EAV-02': { variant: 'warm' },
  'D-VRG-01': { variant: 'cold' },
  'D-VRG-02': { variant: 'warm' },
  'D-FLR-01': { variant: 'joist' },
  'D-FLR-02': { ins: 180, lining: 'dry', variant: 'slab' },
  'D-PTY-01': { variant: 'eps' },
  'D-PTY-02': { ins: 180, mat: 'mw', lining: 'dry', variant: 'mw' },
  'D-CRN-01': {},
  'D-CRN-02': {},
  'D-BAL-01': { ins: 180, lining: 'dry' },
  'D-SRV-01': { variant: 'pipe' },
  'D-SRV-02': { variant: 'block' },
  'D-MOV-01': {},
}

const TYPE_LABELS = {
  'ground-floor': 'Ground floor', 'window-head': 'Window head', 'window-jamb': 'Window jamb',
  'window-sill': 'Window sill', 'door-threshold': 'Door threshold', 'eaves': 'Eaves', 'verge': 'Verge / gable',
  'intermediate-floor': 'Intermediate floor', 'party-wall': 'Party wall', 'external-corner': 'External corner',
  'internal-corner': 'Internal corner', 'balcony': 'Balcony', 'service-penetration': 'Service penetration',
  'movement-joint': 'Movement joint', 'plinth': 'Plinth',
}

/** Top-level scalar keys of a front-matter block; enough for the fields the drawings need. @param {string} text */
function frontMatter(text) {
  const m = /^---\r?\n([\s\S]*?)\r?\n---/.exec(text)
  if (!m) throw new Error('no front matter')
  /** @type {Record<string, string>} */
  const out = {}
  for (const line of m[1].split(/\r?\n/)) {
    const kv = /^([A-Za-z]+):\s*(.*)$/.exec(line)
    if (kv && kv[2] !== '') out[kv[1]] = kv[2].replace(/^"(.*)"$/, '$1')
  }
  return out
}

function main() {
  mkdirSync(outDir, { recursive: true })
  const files = readdirSync(detailsDir).filter(n => n.endsWith('.md')).sort()
  let n = 0
  for (const file of files) {
    const fm = frontMatter(readFileSync(join(detailsDir, file), 'utf8'))
    const { code, title, revision, revisionDate, junctionType, drawing } = fm
    const draw = junctions[junctionType]
    if (!draw) throw new Error(`${file}: no drawing for junction type "${junctionType}"`)
    /** @type {Params} */
    const p = { blk: 215, ins: 150, mat: 'geps', lining: 'plaster', variant: '', ...(PARAMS[code] ?? {}) }
    const d = new Drawing()
    const view = draw(d, p)
    const svg = render(d, {
      code, title, revision, revisionDate,
      view: `${view} — ${p.blk} mm block, ${p.ins} mm ${p.mat === 'mw' ? 'mineral wool' : p.mat === 'eps' ? 'white EPS' : 'graphite EPS'}`,
      typeLabel: TYPE_LABELS[/** @type {keyof typeof TYPE_LABELS} */ (junctionType)],
    })
    writeFileSync(join(outDir, drawing), svg)
    n++
  }
  console.log(`wrote ${n} drawings to ${outDir}`)
}

main()
