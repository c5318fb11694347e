/** The one place where part rows and domain types are mapped in both directions. */
import type {
  DiodeParams,
  DriverParams,
  MosfetParams,
  MotorParams,
  Part,
  PartSource,
  RdsOnSpecPoint,
  ZthPoint,
} from '../../lib/domain/parts.ts';
import type {
  DbDiodeRow,
  DbDriverRow,
  DbMosfetRow,
  DbMotorRow,
  DbPartRow,
  DbPriceBreakRow,
  DbRdsOnGoverningRow,
  DbRdsOnRow,
  DbSourceRow,
  DbZthRow,
} from './part-rows.ts';
import { governingRdsOnIntervals } from '../../lib/rdson-governing.ts';

export function isoDate(value: Date | string | null): string | null {
  if (value === null) return null;
  if (typeof value === 'string') return value.slice(0, 10);
  return value.toISOString().slice(0, 10);
}

export function mosfetToRow(partId: number, p: MosfetParams): DbMosfetRow {
  return {
    part_id: partId,
    channel: p.channel,
    vds_max_v: p.vdsMaxV,
    vgs_max_v: p.vgsMaxV,
    vgs_th_min_v: p.vgsThMinV,
    vgs_th_max_v: p.vgsThMaxV,
    vgs_th_test_current_a: p.vgsThTestCurrentA,
    id_continuous_a: p.idContinuousA,
    id_pulsed_a: p.idPulsedA,
    qg_total_nc: p.qgTotalNc,
    qg_test_vgs_v: p.qgTestVgsV,
    qgs_nc: p.qgsNc,
    qgd_nc: p.qgdNc,
    v_plateau_v: p.vPlateauV,
    rth_ja_c_per_w: p.rthJaCPerW,
    tj_max_c: p.tjMaxC,
    body_diode_vf_v: p.bodyDiodeVfV,
    min_rds_on_vgs_v: Math.min(...p.rdsOn.map((r) => r.vgsV)),
  };
}

export function rdsOnToRows(partId: number, points: RdsOnSpecPoint[]): DbRdsOnRow[] {
  return points.map((r) => ({
    part_id: partId,
    vgs_v: r.vgsV,
    tj_c: r.tjC,
    max_ohm: r.maxOhm,
    typ_ohm: r.typOhm,
    id_a: r.idA,
  }));
}

/** The governing line per VGS interval (mosfet_rds_on_governing), derived from the RDS(on) lines. */
export function governingToRows(partId: number, points: RdsOnSpecPoint[]): DbRdsOnGoverningRow[] {
  return governingRdsOnIntervals(points).map((g) => ({ part_id: partId, vgs_from_v: g.vgsFromV, vgs_to_v: g.vgsToV, max_ohm: g.maxOhm }));
}

export function zthToRows(partId: number, points: ZthPoint[]): DbZthRow[] {
  return points.map((z) => ({ part_id: partId, pulse_s: z.pulseS, zth_c_per_w: z.zthCPerW }));
}

export function mosfetFromRows(row: DbMosfetRow, points: DbRdsOnRow[], zth: DbZthRow[]): MosfetParams {
  return {
    channel: row.channel,
    vdsMaxV: row.vds_max_v,
    vgsMaxV: row.vgs_max_v,
    vgsThMinV: row.vgs_th_min_v,
    vgsThMaxV: row.vgs_th_max_v,
    vgsThTestCurrentA: row.vgs_th_test_current_a,
    idContinuousA: row.id_continuous_a,
    idPulsedA: row.id_pulsed_a,
    qgTotalNc: row.qg_total_nc,
    qgTestVgsV: row.qg_test_vgs_v,
    qgsNc: row.qgs_nc,
    qgdNc: row.qgd_nc,
    vPlateauV: row.v_plateau_v,
    rthJaCPerW: row.rth_ja_c_per_w,
    tjMaxC: row.tj_max_c,
    bodyDiodeVfV: row.body_diode_vf_v,
    rdsOn: points
      .map((r) => ({ vgsV: r.vgs_v, tjC: r.tj_c, maxOhm: r.max_ohm, typOhm: r.typ_ohm, idA: r.id_a }))
      .sort((a, b) => a.vgsV - b.vgsV || a.tjC - b.tjC),
    zthPoints: zth.map((z) => ({ pulseS: z.pulse_s, zthCPerW: z.zth_c_per_w })).sort((a, b) => a.pulseS - b.pulseS),
  };
}

export function driverToRow(partId: number, p: DriverParams): DbDriverRow {
  return {
    part_id: partId,
    kind: p.kind,
    channels: p.channels,
    inverting: p.inverting,
    supply_min_v: p.supplyMinV,
    supply_max_v: p.supplyMaxV,
    input_logic: p.inputLogic,
    input_high_min: p.inputHighMin,
    input_low_max: p.inputLowMax,
    output_high_drop_v: p.outputHighDropV,
    output_low_max_v: p.outputLowMaxV,
    source_current_a: p.sourceCurrentA,
    sink_current_a: p.sinkCurrentA,
    propagation_delay_ns: p.propagationDelayNs,
    input_pull: p.inputPull,
    input_pull_ohms: p.inputPullOhms,
  };
}

export function driverFromRow(row: DbDriverRow): DriverParams {
  return {
    kind: row.kind,
    channels: row.channels,
    inverting: Boolean(row.inverting),
    supplyMinV: row.supply_min_v,
    supplyMaxV: row.supply_max_v,
    inputLogic: row.input_logic,
    inputHighMin: row.input_high_min,
    inputLowMax: row.input_low_max,
    outputHighDropV: row.output_high_drop_v,
    outputLowMaxV: row.output_low_max_v,
    sourceCurrentA: row.source_current_a,
    sinkCurrentA: row.sink_current_a,
    propagationDelayNs: row.propagation_delay_ns,
    inputPull: row.input_pull,
    inputPullOhms: row.input_pull_ohms,
  };
}

export function diodeToRow(partId: number, p: DiodeParams): DbDiodeRow {
  return {
    part_id: partId,
    kind: p.kind,
    vrrm_v: p.vrrmV,
    if_av_a: p.ifAvA,
    ifsm_a: p.ifsmA,
    vf_v: p.vfV,
    vf_at_if_a: p.vfAtIfA,
    trr_ns: p.trrNs,
    ifrm_a: p.ifrmA,
    rth_ja_c_per_w: p.rthJaCPerW,
    tj_max_c: p.tjMaxC,
  };
}

export function diodeFromRow(row: DbDiodeRow): DiodeParams {
  return {
    kind: row.kind,
    vrrmV: row.vrrm_v,
    ifAvA: row.if_av_a,
    ifsmA: row.ifsm_a,
    vfV: row.vf_v,
    vfAtIfA: row.vf_at_if_a,
    trrNs: row.trr_ns,
    ifrmA: row.ifrm_a,
    rthJaCPerW: row.rth_ja_c_per_w,
    tjMaxC: row.tj_max_c,
  };
}

export function motorToRow(partId: number, p: MotorParams): DbMotorRow {
  return {
    part_id: partId,
    rated_voltage_v: p.ratedVoltageV,
    voltage_min_v: p.voltageMinV,
    voltage_max_v: p.voltageMaxV,
    no_load_speed_rpm: p.noLoadSpeedRpm,
    no_load_current_a: p.noLoadCurrentA,
    stall_torque_nm: p.stallTorqueNm,
    stall_current_a: p.stallCurrentA,
    terminal_resistance_ohm: p.terminalResistanceOhm,
    inductance_h: p.inductanceH,
    rotor_inertia_kg_m2: p.rotorInertiaKgM2,
  };
}

export function motorFromRow(row: DbMotorRow): MotorParams {
  return {
    ratedVoltageV: row.rated_voltage_v,
    voltageMinV: row.voltage_min_v,
    voltageMaxV: row.voltage_max_v,
    noLoadSpeedRpm: row.no_load_speed_rpm,
    noLoadCurrentA: row.no_load_current_a,
    stallTorqueNm: row.stall_torque_nm,
    stallCurrentA: row.stall_current_a,
    terminalResistanceOhm: row.terminal_resistance_ohm,
    inductanceH: row.inductance_h,
    rotorInertiaKgM2: row.rotor_inertia_kg_m2,
  };
}

export function sourceFromRows(row: DbSourceRow, breaks: DbPriceBreakRow[]): PartSource {
  return {
    id: row.id,
    distributor: row.distributor,
    sku: row.sku,
    moq: row.moq,
    orderMultiple: row.order_multiple,
    leadTimeDays: row.lead_time_days,
    stockQty: row.stock_qty,
    currency: row.currency,
    priceBreaks: breaks.map((b) => ({ qty: b.qty, unitPrice: Number(b.unit_price) })).sort((a, b) => a.qty - b.qty),
  };
}

type PartHead = Omit<Part, 'category' | 'params'>;

export function partHeadFromRow(row: DbPartRow, sources: PartSource[]): PartHead {
  return {
    id: row.id,
    manufacturer: row.manufacturer,
    mpn: row.mpn,
    description: row.description,
    package: row.package,
    lifecycle: row.lifecycle,
    lifecycleEffectiveDate: isoDate(row.lifecycle_effective_date),
    reviewStatus: row.review_status,
    version: row.version,
    sources,
  };
}
