using BenchmarkDotNet.Running;
using Lightward.Benchmarks;

// Pick benchmarks with --filter, e.g. `dotnet run -c Release --project tests/Lightward.Benchmarks -- --filter '*Sky*'`;
// `-- --side-by-side` measures each speed goal's baseline and candidate in alternating blocks instead.
if (args is ["--side-by-side"]) SideBySide.Run(Console.Out);
else BenchmarkSwitcher.FromAssembly(typeof(Program).Assembly).Run(args);
