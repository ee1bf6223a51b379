using System.Reflection;
using System.Runtime.Loader;

namespace Lightward.Benchmarks;

/// <summary>
/// Two builds of the code in one process: the benchmark assembly of each build directory is loaded into a load
/// context of its own, with that build's Lightward assemblies, and the same frame is rendered by both in alternating
/// blocks. The machine's drift then falls on both alike, and the median of the per-pair ratios (B over A) is read
/// instead of two figures taken minutes apart. Every case is a frame from the benchmark classes
/// (<see cref="FrameCases"/>), so the comparison needs nothing but the two output directories.
/// </summary>
internal static class BuildComparison
{
    private const int FramesPerBlock = 10;

    public static void Run(TextWriter output, string buildA, string buildB, string cases, int blocks)
    {
        BuildContext[] builds = [new("A", buildA), new("B", buildB)];
        output.WriteLine($"A = {Path.GetFullPath(buildA)}");
        output.WriteLine($"B = {Path.GetFullPath(buildB)}");
        output.WriteLine($"alternating blocks of {FramesPerBlock} frames, each after one untimed frame; {blocks} blocks each; medians");
        output.WriteLine($"{"case",-10} {"A",10} {"B",10} {"B/A",7} {"quartiles of B/A",20}");
        foreach (string name in cases.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            Action[] frames = [.. builds.Select(build => build.Frame(name))];
            for (int warm = 0; warm < 10; warm++) foreach (Action frame in frames) frame();
            var times = new double[2][];
            times[0] = new double[blocks];
            times[1] = new double[blocks];
            var ratios = new double[blocks];
            for (int block = 0; block < blocks; block++)
            {
                // Each build goes first in every other block.
                foreach (int k in block % 2 == 0 ? [0, 1] : new[] { 1, 0 }) times[k][block] = FrameTiming.TimeBlock(frames[k], FramesPerBlock);
                ratios[block] = times[1][block] / times[0][block];
            }
            double medianA = FrameTiming.Median(times[0]), medianB = FrameTiming.Median(times[1]);
            output.WriteLine($"{name,-10} {medianA,7:F3} ms {medianB,7:F3} ms {FrameTiming.Median(ratios),7:F3} {$"{FrameTiming.Quantile(ratios, 0.25):F3} – {FrameTiming.Quantile(ratios, 0.75):F3}",20}");
        }
    }

    /// <summary>One build directory's assemblies; the runtime's own come from the default context.</summary>
    private sealed class BuildContext(string name, string directory) : AssemblyLoadContext($"build {name}")
    {
        private readonly string _directory = Directory.Exists(directory) ? Path.GetFullPath(directory)
            : throw new DirectoryNotFoundException($"--compare-builds: no build directory '{directory}'");

        public Action Frame(string name)
        {
            string path = Path.Combine(_directory, "Lightward.Benchmarks.dll");
            if (!File.Exists(path)) throw new FileNotFoundException($"--compare-builds: '{_directory}' holds no Lightward.Benchmarks.dll (build the benchmark project into it)");
            MethodInfo create = LoadFromAssemblyPath(path).GetType(typeof(FrameCases).FullName!)?.GetMethod(nameof(FrameCases.Create))
                ?? throw new InvalidOperationException($"--compare-builds: the build in '{_directory}' predates {nameof(FrameCases)}");
            return (Action)create.Invoke(null, [name])!;
        }

        protected override Assembly? Load(AssemblyName assemblyName)
        {
            string path = Path.Combine(_directory, assemblyName.Name + ".dll");
            bool ours = !assemblyName.Name!.StartsWith("System.", StringComparison.Ordinal) && !assemblyName.Name.StartsWith("Microsoft.", StringComparison.Ordinal);
            return ours && File.Exists(path) ? LoadFromAssemblyPath(path) : null;
        }

        protected override IntPtr LoadUnmanagedDll(string unmanagedDllName)
        {
            string native = Path.Combine(_directory, "runtimes", "linux-x64", "native");
            string? library = Directory.Exists(native) ? Directory.GetFiles(native, $"*{unmanagedDllName}*.so").FirstOrDefault() : null;
            return library is null ? IntPtr.Zero : LoadUnmanagedDllFromPath(library);
        }
    }
}

/// <summary>The frames <see cref="BuildComparison"/> can time, by name, each set up as its benchmark sets it up.</summary>
public static class FrameCases
{
    public const string Names = "stars, turning, skia, fullsky, fullsky3, persp3, nf24, nf48, nf96, plain, grid, bodies";

    public static Action Create(string name)
    {
        switch (name)
        {
            case "stars" or "turning" or "skia":
            {
                var frames = new RenderFrameBenchmarks();
                frames.Setup();
                return name switch { "stars" => frames.PipelineAtRest, "turning" => frames.PipelineTurning, _ => frames.SkiaCirclePerStar };
            }
            case "fullsky" or "fullsky3" or "persp3":
            {
                var speed = new RelativisticCostBenchmarks();
                speed.Setup();
                return name switch { "fullsky" => speed.FullSkyAtRest, "fullsky3" => speed.FullSkyAtRapidity3, _ => speed.PerspectiveAtRapidity3 };
            }
            case "nf24" or "nf48" or "nf96" or "plain" or "grid" or "bodies":
            {
                var nearField = new NearFieldBenchmarks { Bands = name is "plain" or "grid" or "bodies" ? 24 : int.Parse(name[2..]) };
                nearField.Setup();
                return name switch { "plain" => nearField.FrameWithoutNearField, "grid" => nearField.GridAlone, "bodies" => nearField.BodiesAlone, _ => nearField.FrameWithBodiesAndGrid };
            }
            default:
                throw new ArgumentException($"--compare-builds: no frame '{name}'; the frames are {Names}");
        }
    }
}
