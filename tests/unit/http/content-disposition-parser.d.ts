// Typing for the copy of jshttp's content-disposition package that next vendors at
// next/dist/compiled/content-disposition (CommonJS, no types). Used only as an independent parser.
declare module "next/dist/compiled/content-disposition" {
  interface ContentDisposition {
    type: string;
    parameters: Record<string, string>;
  }
  const contentDisposition: { parse(header: string): ContentDisposition };
  export default contentDisposition;
}
