// geographiclib-geodesic 2.x ships minified CommonJS with named-export typings. Under ESM the named
// imports type-check but fail at run time (Node/tsx: "does not provide an export named 'Geodesic'";
// bundlers: undefined); only the default import, the CommonJS exports object, works. Declaring just the
// default export here makes the broken form a compile error, and marks the result fields that the
// default outmask always fills as present rather than optional.
declare module "geographiclib-geodesic" {
  type InverseResult = {
    lat1: number;
    lon1: number;
    lat2: number;
    lon2: number;
    a12: number;
    s12: number;
    azi1: number;
    azi2: number;
  };

  type DirectResult = {
    lat1: number;
    lon1: number;
    azi1: number;
    s12: number;
    a12: number;
    lat2: number;
    lon2: number;
    azi2: number;
  };

  interface GeodesicInstance {
    Inverse(lat1: number, lon1: number, lat2: number, lon2: number, outmask?: number): InverseResult;
    Direct(lat1: number, lon1: number, azi1: number, s12: number, outmask?: number): DirectResult;
  }

  const geographiclib: {
    Geodesic: {
      Geodesic: new (a: number, f: number) => GeodesicInstance;
      WGS84: GeodesicInstance;
    };
    Constants: {
      WGS84: { a: number; f: number };
      version_string: string;
    };
  };

  export default geographiclib;
}
