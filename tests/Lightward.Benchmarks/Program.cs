using BenchmarkDotNet.Running;
using Lightward.Benchmarks;

// Pick benchmarks with --filter, e.g. `dotnet run -c Release --project tests/Lightward.Benchmarks -- --filter '*Sky*'`;
// `-- --side-by-side` measures each speed goal's baseline and candidate in alternating blocks instead;
// `-- --compare-builds <dirA> <dirB> [frames] [blocks]` times the same frames from two builds in one process.
if (args is ["--side-by-side"]) SideBySide.Run(Console.Out);
else if (args is ["--compare-builds", string buildA, string buildB, ..])
{
    try
    {
        BuildComparison.Run(Console.Out, buildA, buildB, args.Length > 3 ? args[3] : "stars,turning,nf24",
            args.Length > 4 && int.TryParse(args[4], out int blocks) && blocks > 0 ? blocks : 40);
    }
    catch (Exception failure) when (failure is IOException or ArgumentException or InvalidOperationException
        || failure.InnerException is ArgumentException)
    {
        Console.Error.WriteLine($"lightward benchmarks: error: {(failure.InnerException ?? failure).Message}");
        return 2;
    }
}
else BenchmarkSwitcher.FromAssembly(typeof(Program).Assembly).Run(args);
return 0;
