/** Row types: the database's shape (snake_case). Mapped to domain types in part-mapping.ts only. */
import type { DiodeKind, DriverInputLogic, Lifecycle, PartCategory, ReviewStatus } from '../../lib/domain/parts.ts';

export interface DbPartRow {
  id: number;
  category: PartCategory;
  manufacturer: string;
  mpn: string;
  description: string;
  package: string;
  lifecycle: Lifecycle;
  lifecycle_effective_date: Date | string | null;
  lifecycle_note: string | null;
  review_status: ReviewStatus;
  review_note: string | null;
  created_by: number | null;
  created_at: Date;
  updated_at: Date;
  version: number;
}

export interface DbMosfetRow {
  part_id: number;
  channel: 'n' | 'p';
  vds_max_v: number;
  vgs_max_v: number;
  vgs_th_min_v: number;
  vgs_th_max_v: number;
  vgs_th_test_current_a: number;
  id_continuous_a: number;
  id_pulsed_a: number;
  qg_total_nc: number;
  qg_test_vgs_v: number;
  qgs_nc: number | null;
  qgd_nc: number | null;
  v_plateau_v: number | null;
  rth_ja_c_per_w: number;
  tj_max_c: number;
  body_diode_vf_v: number | null;
  min_rds_on_vgs_v: number;
}

export interface DbRdsOnRow {
  id?: number;
  part_id: number;
  vgs_v: number;
  tj_c: number;
  max_ohm: number;
  typ_ohm: number | null;
  id_a: number | null;
}

/** mosfet_rds_on_governing: the governing 25 °C line per VGS interval (src/lib/rdson-governing.ts). */
export interface DbRdsOnGoverningRow {
  part_id: number;
  vgs_from_v: number;
  vgs_to_v: number | null;
  max_ohm: number;
}

export interface DbZthRow {
  id?: number;
  part_id: number;
  pulse_s: number;
  zth_c_per_w: number;
}

export interface DbDriverRow {
  part_id: number;
  kind: 'gate-driver' | 'level-shifter';
  channels: number;
  inverting: number | boolean;
  supply_min_v: number;
  supply_max_v: number;
  input_logic: DriverInputLogic;
  input_high_min: number;
  input_low_max: number;
  output_high_drop_v: number;
  output_low_max_v: number;
  source_current_a: number;
  sink_current_a: number;
  propagation_delay_ns: number;
  input_pull: 'up' | 'down' | 'none';
  input_pull_ohms: number | null;
}

export interface DbDiodeRow {
  part_id: number;
  kind: DiodeKind;
  vrrm_v: number;
  if_av_a: number;
  ifsm_a: number;
  vf_v: number;
  vf_at_if_a: number;
  trr_ns: number | null;
  ifrm_a: number | null;
  rth_ja_c_per_w: number | null;
  tj_max_c: number | null;
}

export interface DbMotorRow {
  part_id: number;
  rated_voltage_v: number;
  voltage_min_v: number | null;
  voltage_max_v: number | null;
  no_load_speed_rpm: number;
  no_load_current_a: number;
  stall_torque_nm: number;
  stall_current_a: number;
  terminal_resistance_ohm: number | null;
  inductance_h: number | null;
  rotor_inertia_kg_m2: number | null;
}

export interface DbSourceRow {
  id: number;
  part_id: number;
  distributor: string;
  sku: string;
  moq: number;
  order_multiple: number;
  lead_time_days: number;
  stock_qty: number;
  currency: string;
  updated_at: Date;
}

export interface DbPriceBreakRow {
  id?: number;
  source_id: number;
  qty: number;
  unit_price: number | string;
}
