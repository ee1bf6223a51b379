using Lightward.Rendering.NearField;
using Lightward.Scenarios.Model;
using Lightward.Spacetime;

namespace Lightward.Cli.Commands;

/// <summary>Builds the near field (bodies and the grid of space) of a scenario for the view commands.</summary>
public static class ViewNearField
{
    /// <summary>Luminance of a body given only a colour: a softly lit panel, cd/m² (common practice, no published source).</summary>
    public const double PanelLuminance = 50;
    /// <summary>Colour temperature of the white a given colour is a tint of: D65's correlated temperature, K (CIE 15).</summary>
    public const double PanelWhite = 6504;

    public static NearFieldLayer FromScenario(Scenario scenario)
    {
        NearFieldBody[] bodies = scenario.Bodies.Select(Body).ToArray();
        return new NearFieldLayer(bodies, Grid(scenario));
    }

    /// <summary>A grid at rest in the home frame for scenes without a scenario (`--grid SPACING`): ten spacings around the camera.</summary>
    public static NearFieldLayer HomeGrid(double spacing) => new([], SpaceGrid.AtRestInHome(spacing, 10 * spacing));

    private static NearFieldBody Body(BodySpec spec)
    {
        TriangleMesh mesh = spec.Shape.Kind switch
        {
            ShapeKind.Sphere => MeshShapes.Sphere(spec.Shape.Size.X),
            ShapeKind.Box => MeshShapes.Box(spec.Shape.Size, tilesPerEdge: 4),
            ShapeKind.Hull => MeshShapes.Hull(spec.Shape.Size.X),
            _ => WavefrontObj.Load(spec.Shape.MeshPath!, spec.Shape.Size.X),
        };
        BodySurface surface = spec.Emission.Temperature is { } temperature
            ? BodySurface.Blackbody(temperature)
            : new BodySurface(SurfaceKind.Glowing, PanelWhite, PanelLuminance, Vec3.UnitZ);
        if (spec.Emission.Colour is { } colour)
            mesh = mesh.Tinted(new SurfaceTint((float)colour.X, (float)colour.Y, (float)colour.Z));
        // The scenario gives the clock's reading at home time zero.
        double offset = spec.ClockOffset is { } reading ? reading - spec.Path.ProperTimeAtHomeTime(0) : 0;
        return new NearFieldBody(spec.Name, mesh, spec.Path, surface, spec.ClockOffset is not null, offset);
    }

    private static SpaceGrid? Grid(Scenario scenario)
    {
        GridSettings grid = scenario.Grid;
        if (grid.Spacing <= 0) return null;
        if (grid.Frame == "home") return SpaceGrid.AtRestInHome(grid.Spacing, grid.Extent);
        IWorldline carrier = scenario.FindBody(grid.Frame)?.Path
            ?? throw new UserInputException($"{scenario.SourcePath}: grid.frame: no body named '{grid.Frame}' (home or a body's name)");
        // The lattice is inertial: it rides with the body's rest frame as at home time zero.
        return new SpaceGrid(grid.Spacing, grid.Extent, carrier.EventAtHomeTime(0), carrier.RestFrameAtHomeTime(0));
    }
}
