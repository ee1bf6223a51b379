using System.Runtime.CompilerServices;
using BenchmarkDotNet.Attributes;
using Lightward.Scenarios.Files;
using Lightward.Scenarios.Flights;
using Lightward.Scenarios.Model;
using Lightward.Spacetime;

namespace Lightward.Benchmarks;

/// <summary>Shipped scenario files, found from this source file.</summary>
internal static class ScenarioFolder
{
    public static string File(string name) => Path.GetFullPath(Path.Combine(Path.GetDirectoryName(ThisFile())!, "..", "..", "scenarios", name));

    private static string ThisFile([CallerFilePath] string path = "") => path;
}

/// <summary>
/// Cost of a flight step against plain coasting: constant thrust (one cached exact step reused), guidance that
/// changes the controls every step (a new matrix exponential each step, as the autopilot flies), and recording.
/// </summary>
[MemoryDiagnoser]
public class ScenarioFlightBenchmarks
{
    private const int Steps = 1000;
    private Scenario _scenario = null!;
    private string _folder = null!;

    [GlobalSetup]
    public void Setup()
    {
        _scenario = ScenarioFile.Load(ScenarioFolder.File("free-flight.toml"));
        _folder = Directory.CreateTempSubdirectory("lw-bench-").FullName;
    }

    [GlobalCleanup]
    public void Cleanup() => Directory.Delete(_folder, recursive: true);

    private double Fly(Func<int, Controls> controls, FlightRecorder? recorder = null)
    {
        var flight = new Flight(_scenario, recorder);
        for (int i = 0; i < Steps; i++) flight.Step(controls(i));
        return flight.Ship.HomeTime;
    }

    [Benchmark(Baseline = true)]
    public double Coast() => Fly(_ => Controls.Coast);

    [Benchmark]
    public double ConstantThrust() => Fly(_ => new Controls(new Vec3(0, 0, Units.G), Vec3.Zero));

    [Benchmark]
    public double ControlsChangingEveryStep() => Fly(i => new Controls(new Vec3(0, 1e-3 * i * Units.G, Units.G), Vec3.Zero));

    [Benchmark]
    public double ConstantThrustRecorded()
    {
        using FlightRecorder recorder = FlightRecorder.Create(Path.Combine(_folder, $"{Guid.NewGuid():N}.flightlog"), _scenario, "benchmark");
        return Fly(_ => new Controls(new Vec3(0, 0, Units.G), Vec3.Zero), recorder);
    }
}

/// <summary>Loading a scenario: the TOML syntax tree alone against the full located validation built on it.</summary>
[MemoryDiagnoser]
public class ScenarioFileBenchmarks
{
    private string _text = null!;

    [GlobalSetup]
    public void Setup() => _text = File.ReadAllText(ScenarioFolder.File("dock-tessaly.toml"));

    [Benchmark(Baseline = true)]
    public int SyntaxTreeOnly() => TomlTree.Parse(_text, "dock-tessaly.toml", [])!.Entries.Count;

    [Benchmark]
    public int ValidatedScenario() => ScenarioFile.Parse(_text, "dock-tessaly.toml", "00", [])!.Bodies.Count;
}
