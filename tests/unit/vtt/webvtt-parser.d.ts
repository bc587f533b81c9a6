// Minimal typing of the npm package webvtt-parser 2.2 (W3C's webvtt.js, CommonJS, no bundled
// types), covering only what the tests call. Read from node_modules/webvtt-parser/parser.js.
declare module "webvtt-parser" {
  export interface ParsedCue {
    id: string;
    startTime: number;
    endTime: number;
    text: string;
  }
  export interface ParseError {
    message: string;
    line: number;
    col?: number;
  }
  export interface ParseResult {
    cues: ParsedCue[];
    errors: ParseError[];
  }
  export class WebVTTParser {
    parse(input: string, mode?: "metadata" | "chapters" | "subtitles"): ParseResult;
  }
  export class WebVTTCueTimingsAndSettingsParser {
    constructor(line: string, errorHandler: (message: string, col: number) => void);
    parseTimestamp(): number | undefined;
  }
  const webvtt: {
    WebVTTParser: typeof WebVTTParser;
    WebVTTCueTimingsAndSettingsParser: typeof WebVTTCueTimingsAndSettingsParser;
  };
  export default webvtt;
}
