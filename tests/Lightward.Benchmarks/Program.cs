using BenchmarkDotNet.Running;

// Pick benchmarks with --filter, e.g. `dotnet run -c Release --project tests/Lightward.Benchmarks -- --filter '*Sky*'`.
BenchmarkSwitcher.FromAssembly(typeof(Program).Assembly).Run(args);
