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
        if (args.Length > 5) throw new ArgumentException($"--compare-builds: unexpected argument '{args[5]}' (give two build directories, then optionally frames and a block count)");
        int blocks = 40;
        if (args.Length > 4 && !(int.TryParse(args[4], out blocks) && blocks >= 4))
            throw new ArgumentException($"--compare-builds: block count '{args[4]}' is not a whole number of at least 4");
        BuildComparison.Run(Console.Out, buildA, buildB, args.Length > 3 ? args[3] : "stars,turning,nf24", blocks);
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
