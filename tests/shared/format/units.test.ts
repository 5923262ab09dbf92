// Unit display follows the SI Brochure, 9th ed. (2019) §5.4.3 (a space between number and
// unit, also for % and °C; none for °, ′, ″) and §5.4.6 (products with a space, powers as
// superscripts). The Celsius offset 273.15 K is exact (SI Brochure §2.3.1).
import { describe, expect, it } from 'vitest';
import {
  celsiusToKelvin, convert, convertInterval, formatQuantity, formatUnit, kelvinToCelsius,
  metresToMicrometres, metresToNanometres, micrometresToMetres, nanometresToMetres,
  perMetreToPerMicrometre, perMetreToPerNanometre, perNanometreToPerMetre, MINUS, sensitivityUnit,
} from '../../../shared/format';

describe('formatUnit', () => {
  it('turns ASCII exponents into superscripts', () => {
    expect(formatUnit('W m-2 sr-1 nm-1')).toBe('W m⁻² sr⁻¹ nm⁻¹');
    expect(formatUnit('W*m^-2*sr^-1')).toBe('W m⁻² sr⁻¹');
  });
  it('writes people’s units', () => {
    expect(formatUnit('degC')).toBe('°C');
    expect(formatUnit('um')).toBe('µm');
    expect(formatUnit('μm')).toBe('µm'); // Greek mu becomes the micro sign
    expect(formatUnit('W m-2 sr-1 um-1')).toBe('W m⁻² sr⁻¹ µm⁻¹');
  });
  it('leaves formatted units unchanged', () => {
    expect(formatUnit('W m⁻² sr⁻¹ nm⁻¹')).toBe('W m⁻² sr⁻¹ nm⁻¹');
    expect(formatUnit('K')).toBe('K');
  });
});

describe('formatQuantity (space before the unit)', () => {
  it('puts a space before K, °C and %', () => {
    expect(formatQuantity(773.15, 'K')).toBe('773.15 K');
    expect(formatQuantity(0.12, 'degC')).toBe('0.12 °C');
    expect(formatQuantity(45, '%')).toBe('45 %');
  });
  it('puts no space before the plane-angle degree', () => {
    expect(formatQuantity(30, '°')).toBe('30°');
  });
  it('groups and powers as formatNumber does', () => {
    expect(formatQuantity(50000838, 'nm', { notation: 'fixed' })).toBe('50\u202F000\u202F838 nm');
    expect(formatQuantity(2.5e-7, 'W m-2 sr-1 nm-1', { digits: 2 })).toBe('2.5 × 10⁻⁷ W m⁻² sr⁻¹ nm⁻¹');
    expect(formatQuantity(-40, '°C')).toBe(`${MINUS}40 °C`);
  });
});

describe('SI conversions', () => {
  it('K ↔ °C with the exact offset 273.15 K', () => {
    expect(kelvinToCelsius(773.15)).toBe(500);
    expect(celsiusToKelvin(-273.15)).toBe(0);
    expect(celsiusToKelvin(23)).toBe(296.15);
  });
  it('m ↔ nm and µm without binary noise', () => {
    expect(metresToNanometres(650e-9)).toBe(650);
    expect(nanometresToMetres(650)).toBe(6.5e-7);
    expect(metresToMicrometres(1e-5)).toBe(10);
    expect(micrometresToMetres(8)).toBe(8e-6);
  });
  it('spectral radiance per m ↔ per nm and per µm (1 m = 10⁹ nm = 10⁶ µm)', () => {
    expect(perMetreToPerNanometre(1.23e7)).toBe(0.0123);
    expect(perNanometreToPerMetre(0.0123)).toBe(1.23e7);
    expect(perMetreToPerMicrometre(1.23e7)).toBe(12.3);
  });
  it('convert() applies the Celsius offset to values', () => {
    expect(convert(500, '°C', 'K')).toBe(773.15);
    expect(convert(773.15, 'K', 'degC')).toBe(500);
    expect(convert(650, 'nm', 'µm')).toBe(0.65);
    expect(convert(1, 'W m-2 sr-1 nm-1', 'W m-2 sr-1 m-1')).toBe(1e9);
  });
  it('convertInterval() never applies the offset (an uncertainty of 0.05 K is 0.05 °C)', () => {
    expect(convertInterval(0.05, 'K', '°C')).toBe(0.05);
    expect(convertInterval(12, 'mK', 'K')).toBe(0.012);
  });
  it('refuses unknown units and mixed quantities', () => {
    expect(() => convert(1, 'K', 'nm')).toThrow(/different quantities/);
    expect(() => convert(1, 'furlong', 'm')).toThrow(/Unknown unit/);
  });
});

describe('sensitivityUnit (c_i = ∂y/∂x_i, JCGM 100:2008 §5.1.3)', () => {
  it('is y per x, empty when both have the same size, y alone for a dimensionless input', () => {
    expect(sensitivityUnit('K', 'µm')).toBe('K/µm');
    expect(sensitivityUnit('K', '°C')).toBe(''); // a difference of 1 °C is 1 K (SI Brochure §2.3.1)
    expect(sensitivityUnit('K', 'K')).toBe('');
    expect(sensitivityUnit('K', '1')).toBe('K');
    expect(sensitivityUnit('K', '')).toBe('K');
    expect(sensitivityUnit('', 'K')).toBe('K⁻¹');
    expect(sensitivityUnit('', '')).toBe('');
  });

  it('keeps one solidus at most (SI Brochure §5.4.6)', () => {
    expect(sensitivityUnit('W m-2 sr-1 nm-1', 'K')).toBe('W m⁻² sr⁻¹ nm⁻¹ K⁻¹');
    expect(sensitivityUnit('K', 'W m-2 sr-1 nm-1')).toBe('K/(W m⁻² sr⁻¹ nm⁻¹)');
  });
});
