using Lightward.Scenarios.Files;
using Lightward.Spacetime;
using ScottPlot;

namespace Lightward.Scenarios.Flights;

/// <summary>
/// A spacetime diagram of a flight in the home frame: home time up, distance along the line of the task across,
/// the flown worldline against the reference (autopilot) one, with the start event's light cone and the light
/// cones of a few events along the flight, drawn at 45° (equal units of time and light travel).
/// </summary>
public static class WorldlinePlot
{
    private const int LightCones = 4;

    public static void Save(string path, Flight flown, Flight? reference)
    {
        Vec3 start = flown.Scenario.Ship.Start.Space;
        double startTime = flown.Scenario.Ship.Start.T;
        Vec3 axis = LineOfTask(flown);
        double span = Math.Max(flown.HomeTimeFlown, reference?.HomeTimeFlown ?? 0);
        (double scale, string timeUnit, string lengthUnit) = span >= Units.JulianYear ? (Units.JulianYear, "yr", "ly")
            : span >= Units.Day ? (Units.Day, "d", "ld") : (1.0, "s", "ls");

        (double[] X, double[] T) Project(IReadOnlyList<FourVector> track) =>
            (track.Select(e => Vec3.Dot(e.Space - start, axis) / scale).ToArray(), track.Select(e => (e.T - startTime) / scale).ToArray());

        var plot = new Plot();
        double top = span / scale;
        AddCone(plot, 0, 0, top, "light cone of the start");
        var flownTrack = Project(flown.Track);
        int every = Math.Max(1, flownTrack.X.Length / LightCones);
        for (int i = every; i < flownTrack.X.Length; i += every)
            AddCone(plot, flownTrack.X[i], flownTrack.T[i], top, null);
        if (reference is not null)
        {
            var referenceTrack = Project(reference.Track);
            var line = plot.Add.Scatter(referenceTrack.X, referenceTrack.T);
            line.LegendText = "reference (autopilot)";
            line.MarkerSize = 0;
            line.LineWidth = 2;
            line.LinePattern = LinePattern.Dashed;
            line.Color = Colors.SteelBlue;
        }
        var flownLine = plot.Add.Scatter(flownTrack.X, flownTrack.T);
        flownLine.LegendText = "flown";
        flownLine.MarkerSize = 0;
        flownLine.LineWidth = 2;
        flownLine.Color = Colors.OrangeRed;
        plot.Title($"{flown.Scenario.Title}: worldlines in the home frame");
        plot.XLabel($"distance along the task line, {lengthUnit}");
        plot.YLabel($"home time since start, {timeUnit}");
        plot.Axes.SquareUnits();
        plot.ShowLegend();
        UserFiles.WriteAtomically(path, stream =>
        {
            byte[] png = plot.GetImageBytes(1000, 800, ImageFormat.Png);
            stream.Write(png);
        });
    }

    /// <summary>Future light cone of the event (x, t) up to time <paramref name="top"/>: two lines at 45°.</summary>
    private static void AddCone(Plot plot, double x, double t, double top, string? label)
    {
        double reach = Math.Max(0, top - t);
        foreach (double side in (double[])[-1, 1])
        {
            var edge = plot.Add.Line(x, t, x + side * reach, t + reach);
            edge.Color = Colors.Gray.WithAlpha(0.6);
            edge.LinePattern = LinePattern.Dotted;
            if (label is not null && side > 0) edge.LegendText = label;
        }
    }

    /// <summary>The direction the task is about (toward its point or target), else the way the ship ended up going.</summary>
    private static Vec3 LineOfTask(Flight flight)
    {
        var scenario = flight.Scenario;
        Vec3 start = scenario.Ship.Start.Space;
        Vec3 toward = scenario.Task.Target is { } name
            ? scenario.FindBody(name)!.Path.EventAtHomeTime(scenario.Ship.Start.T).Space - start
            : scenario.Task.Point - start;
        if (toward.Length > 0) return toward / toward.Length;
        Vec3 farthest = flight.Track.Select(e => e.Space - start).MaxBy(v => v.Length);
        return farthest.NormalizedOr(Vec3.UnitX);
    }
}
