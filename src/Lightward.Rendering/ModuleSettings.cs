using System.Runtime.CompilerServices;

// The hot loops' stack buffers are written before they are read, so the zeroing the runtime would otherwise give every
// stackalloc (a tile's 24 KB scratch planes per row band, a chunk's camera directions) is pure cost.
[module: SkipLocalsInit]
