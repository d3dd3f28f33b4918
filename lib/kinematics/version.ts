// Version of the estimating engine. Stored with every estimate so that a changed model can be
// told apart from a changed program or profile: bump the minor for a model change that moves
// estimates, the patch for a fix that does not.
export const ENGINE_VERSION = '1.0.0';
