import { DataTypes, type QueryInterface } from 'sequelize'

// The inlet gas solute mole fraction of a logged month (optional): the month is rated at its
// own inlet concentration; without it the approved design's inlet is used.

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.addColumn('operating_entries', 'inlet_mole_fraction', { type: DataTypes.DOUBLE, allowNull: true })
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.removeColumn('operating_entries', 'inlet_mole_fraction')
}
