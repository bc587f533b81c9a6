// Minimal typing of the npm package smpte-timecode 1.3 (CommonJS, no bundled types), covering
// only what the oracle tests call. Read from node_modules/smpte-timecode/smpte-timecode.js.
declare module "smpte-timecode" {
  interface Timecode {
    frameCount: number;
    hours: number;
    minutes: number;
    seconds: number;
    frames: number;
    dropFrame: boolean;
    toString(): string;
  }
  interface TimecodeConstructor {
    new (timeCode: number | string, frameRate?: number | [number, number], dropFrame?: boolean): Timecode;
    (timeCode: number | string, frameRate?: number | [number, number], dropFrame?: boolean): Timecode;
  }
  const Timecode: TimecodeConstructor;
  export default Timecode;
}
