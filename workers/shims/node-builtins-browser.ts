// Stand-ins for the Node built-ins that gcode-parser imports at its top level (events, fs,
// stream, timers) when lib/gcode is bundled for a Web Worker. Only parseLine is used there; its
// file and stream helpers never run in a worker, but the module body subclasses
// stream.Transform at load time, so Transform must be a class.
class Stub {}

export class Transform extends Stub {}
export class Readable extends Stub {}

const builtins = { Transform, Readable, setImmediate: (fn: () => void) => setTimeout(fn, 0) };
export default builtins;
