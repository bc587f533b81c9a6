// videojs-mux ships no types: importing it registers the `mux` plugin on video.js.
declare module "videojs-mux";
