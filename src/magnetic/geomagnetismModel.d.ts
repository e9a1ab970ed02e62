// Types for the two files of the `geomagnetism` package (0.2.0, CommonJS) that wmm2025.ts uses directly.
// The package's own geomagnetism.d.ts covers only its date-picking entry point.

declare module 'geomagnetism/lib/model.js' {
  /** Field elements at a point: X north, Y east, Z down, H, F [nT]; decl east +, incl down + [deg]. */
  export interface GeomagnetismElements {
    x: number;
    y: number;
    z: number;
    h: number;
    f: number;
    decl: number;
    incl: number;
  }

  /** Spherical-harmonic coefficients as stored in the package's data/wmm-*.json files. */
  export interface GeomagnetismModelOptions {
    epoch: number;
    name?: string;
    start_date: string | Date;
    end_date: string | Date;
    main_field_coeff_g: number[];
    main_field_coeff_h: number[];
    secular_var_coeff_g: number[];
    secular_var_coeff_h: number[];
    n_max: number;
    n_max_sec_var: number;
  }

  class GeomagnetismModel {
    constructor(options: GeomagnetismModelOptions);
    epoch: number;
    name: string;
    start_date: Date;
    end_date: Date;
    /** Coefficients carried to `date` by the linear secular variation (365-day decimal year). */
    getTimedModel(date: Date, allowOutOfBoundsModel?: boolean): GeomagnetismModel;
    /** [latDeg geodetic, lonDeg, height above the WGS-84 ellipsoid in km]. */
    point(coords: number[]): GeomagnetismElements;
  }
  export default GeomagnetismModel;
}
