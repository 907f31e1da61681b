import { DataTypes } from 'sequelize'
import type { Migration } from './types'

/**
 * The price book and the quotations priced from it. Prices are integer cents. A quotation revision is never
 * updated: a change is the next revision letter, which the unique key (enquiry, revision) keeps in order.
 * The seeded prices are invented for the demonstration and say so in their description and `demo` flag.
 */
const DEMO = ' (demo price, invented)'
const seedItems: Array<{ code: string, description: string, unit: string, cents: number, pack?: number, kind: string }> = [
  { code: 'blocks', description: 'Corrstone lightweight-aggregate block 440×215×300', unit: 'nr', cents: 385, kind: 'material' },
  { code: 'thin-layer-mortar', description: 'Corrstone thin-layer mortar, 25 kg bag', unit: 'bag', cents: 1890, kind: 'material' },
  { code: 'starter-mortar', description: 'Levelling mortar for the starter course, 25 kg bag', unit: 'bag', cents: 920, kind: 'material' },
  { code: 'insulation-boards', description: 'Graphite EPS board 1200×600, 150 mm', unit: 'board', cents: 1475, kind: 'material' },
  { code: 'adhesive', description: 'Board adhesive, 25 kg bag', unit: 'bag', cents: 1650, kind: 'material' },
  { code: 'anchors', description: 'Insulation anchor with plate, box of 100', unit: 'nr', cents: 62, pack: 100, kind: 'material' },
  { code: 'mesh', description: 'Glass-fibre reinforcing mesh, 50 m² roll', unit: 'm²', cents: 145, pack: 50, kind: 'material' },
  { code: 'diagonal-patches', description: 'Diagonal mesh patch for opening corners', unit: 'nr', cents: 95, kind: 'material' },
  { code: 'base-coat', description: 'Base coat, 25 kg bag', unit: 'bag', cents: 1780, kind: 'material' },
  { code: 'primer', description: 'Render primer, 10 kg pail', unit: 'kg', cents: 410, pack: 10, kind: 'material' },
  { code: 'finish', description: 'Silicone finish render, 25 kg tub', unit: 'kg', cents: 305, pack: 25, kind: 'material' },
  { code: 'base-track', description: 'Aluminium base track, 2.5 m length', unit: 'm', cents: 720, pack: 2.5, kind: 'material' },
  { code: 'corner-bead', description: 'PVC corner bead with mesh, 2.5 m length', unit: 'm', cents: 210, pack: 2.5, kind: 'material' },
  { code: 'drip-bead', description: 'PVC drip bead with mesh, 2.5 m length', unit: 'm', cents: 260, pack: 2.5, kind: 'material' },
  { code: 'LAB-LAY', description: 'Laying the thin-joint masonry, per m² of wall', unit: 'm²', cents: 2450, kind: 'labour-lay' },
  { code: 'LAB-ETICS', description: 'Installing the ETICS, boards to finish, per m² of wall', unit: 'm²', cents: 4200, kind: 'labour-system' },
  { code: 'DEL-Z1', description: 'Delivery zone 1, within 50 km of the yard', unit: 'load', cents: 18000, kind: 'delivery' },
  { code: 'DEL-Z2', description: 'Delivery zone 2, 50–150 km', unit: 'load', cents: 32000, kind: 'delivery' },
  { code: 'DEL-Z3', description: 'Delivery zone 3, beyond 150 km', unit: 'load', cents: 49500, kind: 'delivery' },
]

export const priceBook: Migration = {
  name: '0008-price-book',
  async up(qi) {
    await qi.createTable('price_items', {
      code: { type: DataTypes.STRING(60), primaryKey: true },
      description: { type: DataTypes.STRING(200), allowNull: false },
      unit: { type: DataTypes.STRING(20), allowNull: false },
      unit_price_cents: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      pack_size: { type: DataTypes.DECIMAL(12, 3), allowNull: true },
      kind: { type: DataTypes.ENUM('material', 'labour-lay', 'labour-system', 'delivery'), allowNull: false },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      demo: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      updated_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' } },
      updated_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    })
    await qi.createTable('quotations', {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      enquiry_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'enquiries', key: 'id' } },
      revision: { type: DataTypes.CHAR(1), allowNull: false },
      scope: { type: DataTypes.STRING(20), allowNull: false },
      // JSON as text, like calculations: read back exactly as written.
      inputs: { type: DataTypes.TEXT('medium'), allowNull: false },
      lines: { type: DataTypes.TEXT('medium'), allowNull: false },
      discount_percent: { type: DataTypes.DECIMAL(5, 2), allowNull: false, defaultValue: 0 },
      vat_percent: { type: DataTypes.DECIMAL(5, 2), allowNull: false },
      valid_until: { type: DataTypes.DATEONLY, allowNull: false },
      subtotal_cents: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
      discount_cents: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
      delivery_cents: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false, defaultValue: 0 },
      vat_cents: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
      total_cents: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
      created_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' } },
      created_at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
      attachment_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'attachments', key: 'id' } },
    })
    await qi.addIndex('quotations', ['enquiry_id', 'revision'], { unique: true, name: 'quotations_enquiry_revision' })
    const now = new Date()
    await qi.bulkInsert('price_items', seedItems.map(i => ({
      code: i.code,
      description: `${i.description}${DEMO}`,
      unit: i.unit,
      unit_price_cents: i.cents,
      pack_size: i.pack ?? null,
      kind: i.kind,
      active: true,
      demo: true,
      updated_by: null,
      updated_at: now,
    })))
  },
  async down(qi) {
    await qi.dropTable('quotations')
    await qi.dropTable('price_items')
  },
}
