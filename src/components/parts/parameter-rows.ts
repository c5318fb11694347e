/** Every parameter of a part as label, value, unit and the test condition it was stated at. */
import { sig } from '../../lib/units.ts';
import type { Part, ZthPoint } from '../../lib/domain/parts.ts';
import { openInputOutput } from '../../lib/driver-input.ts';

export interface ParameterRow {
  label: string;
  value: string;
  unit: string;
  condition: string;
}

const v = (x: number | null | undefined, digits = 4): string => sig(x, digits);
const row = (label: string, value: string, unit = '', condition = ''): ParameterRow => ({ label, value, unit, condition });

/** A pulse length as datasheet curves label it: ms below a second, s above. */
const pulse = (s: number): string => (s < 1 ? `${v(s * 1000)} ms` : `${v(s)} s`);
const zthRows = (points: ZthPoint[]): ParameterRow[] =>
  points.length === 0
    ? [row('Transient thermal impedance Zth(j-a)', '— (no curve points)', '', 'a timed stall cut-off is judged at steady state')]
    : points.map((z) =>
        row('Transient thermal impedance Zth(j-a)', v(z.zthCPerW), 'K/W', `single pulse, tp = ${pulse(z.pulseS)}, datasheet test board`),
      );

export function parameterRows(part: Part): ParameterRow[] {
  switch (part.category) {
    case 'mosfet': {
      const p = part.params;
      return [
        row('Channel', p.channel === 'n' ? 'N-channel' : 'P-channel (magnitudes shown)'),
        row('Drain-source breakdown V(BR)DSS', v(p.vdsMaxV), 'V'),
        row('Gate-source maximum VGS(max)', `±${v(p.vgsMaxV)}`, 'V', 'absolute maximum'),
        row('Gate threshold VGS(th)', `${v(p.vgsThMinV)} – ${v(p.vgsThMaxV)}`, 'V', `ID = ${v(p.vgsThTestCurrentA * 1e6)} µA`),
        row('Continuous drain current ID', v(p.idContinuousA), 'A', 'TA = 25 °C, datasheet test board'),
        row('Pulsed drain current IDM', v(p.idPulsedA), 'A'),
        row('Total gate charge Qg', v(p.qgTotalNc), 'nC', `VGS = ${v(p.qgTestVgsV)} V`),
        row('Gate-source charge Qgs', v(p.qgsNc), 'nC'),
        row('Gate-drain charge Qgd', v(p.qgdNc), 'nC'),
        row('Miller plateau', v(p.vPlateauV), 'V'),
        row('Thermal resistance RθJA', v(p.rthJaCPerW), 'K/W', 'datasheet test board'),
        row('Maximum junction temperature', v(p.tjMaxC), '°C'),
        row('Body-diode forward voltage', v(p.bodyDiodeVfV), 'V', 'typical'),
        ...zthRows(p.zthPoints),
      ];
    }
    case 'driver': {
      const p = part.params;
      const ref = p.inputLogic === 'fixed' ? 'V' : p.inputLogic === 'ratio' ? '× own supply' : '× input rail';
      return [
        row('Kind', p.kind === 'gate-driver' ? 'Gate driver' : 'Level shifter'),
        row('Channels', String(p.channels)),
        row('Polarity', p.inverting ? 'Inverting' : 'Non-inverting'),
        row('Supply range', `${v(p.supplyMinV)} – ${v(p.supplyMaxV)}`, 'V', 'output side'),
        row(
          'Input thresholds',
          p.inputLogic === 'fixed'
            ? 'fixed (TTL-style)'
            : p.inputLogic === 'ratio'
              ? 'ratio of own supply (CMOS)'
              : 'ratio of the input rail',
        ),
        row('Input high VIH min', v(p.inputHighMin), ref),
        row('Input low VIL max', v(p.inputLowMax), ref),
        row('Output high drop', v(p.outputHighDropV), 'V', 'below supply, at rated source current'),
        row('Output low VOL max', v(p.outputLowMaxV), 'V', 'at rated sink current'),
        row('Peak source current', v(p.sourceCurrentA), 'A'),
        row('Peak sink current', v(p.sinkCurrentA), 'A'),
        row('Propagation delay', v(p.propagationDelayNs), 'ns', 'worst case'),
        row(
          'Internal input pull',
          p.inputPull === 'none'
            ? 'none (an open input floats)'
            : `pull-${p.inputPull}${p.inputPullOhms != null ? `, ${v(p.inputPullOhms / 1000)} kΩ typ.` : ', value not stated'}`,
          '',
          'on the input pin, datasheet input structure',
        ),
        row(
          'Output with the input open',
          { low: 'LOW', high: 'HIGH', undefined: 'undefined' }[openInputOutput(p.inputPull, p.inverting)],
          '',
          `derived: input pull ${p.inputPull}, ${p.inverting ? 'inverting' : 'non-inverting'}`,
        ),
      ];
    }
    case 'diode': {
      const p = part.params;
      return [
        row('Kind', p.kind === 'general' ? 'General purpose' : p.kind[0].toUpperCase() + p.kind.slice(1)),
        row('Repetitive reverse voltage VRRM', v(p.vrrmV), 'V'),
        row('Average forward current IF(AV)', v(p.ifAvA), 'A'),
        row('Surge current IFSM', v(p.ifsmA), 'A', 'non-repetitive'),
        row('Forward voltage VF max', v(p.vfV), 'V', `IF = ${v(p.vfAtIfA)} A`),
        row('Reverse recovery trr', p.trrNs === null ? 'none (no stored charge)' : v(p.trrNs), p.trrNs === null ? '' : 'ns'),
        row(
          'Repetitive peak forward current IFRM',
          p.ifrmA === null ? '— (not stated)' : v(p.ifrmA),
          p.ifrmA === null ? '' : 'A',
          'repetitive',
        ),
        row('Thermal resistance RθJA', v(p.rthJaCPerW), 'K/W', 'datasheet test board'),
        row('Maximum junction temperature', v(p.tjMaxC), '°C'),
      ];
    }
    case 'motor': {
      const p = part.params;
      const at = `at ${v(p.ratedVoltageV)} V`;
      return [
        row('Rated voltage', v(p.ratedVoltageV), 'V'),
        row(
          'Operating range',
          p.voltageMinV !== null && p.voltageMaxV !== null ? `${v(p.voltageMinV)} – ${v(p.voltageMaxV)}` : '—',
          'V',
          'recommended',
        ),
        row('No-load speed', v(p.noLoadSpeedRpm, 5), 'rpm', at),
        row('No-load current', v(p.noLoadCurrentA), 'A', at),
        row('Stall torque', v(p.stallTorqueNm * 1000), 'mN·m', at),
        row('Stall current', v(p.stallCurrentA), 'A', at),
        row('Terminal resistance', v(p.terminalResistanceOhm), 'Ω', '20 °C'),
        row('Terminal inductance', p.inductanceH === null ? '—' : v(p.inductanceH * 1000), 'mH'),
        row('Rotor inertia', p.rotorInertiaKgM2 === null ? '—' : v(p.rotorInertiaKgM2 * 1e7), 'g·cm²'),
      ];
    }
  }
}
