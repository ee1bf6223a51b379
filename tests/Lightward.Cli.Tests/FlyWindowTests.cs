using System.Runtime.InteropServices;
using System.Text.Json;
using Lightward.Host;
using Lightward.Host.Frames;
using Lightward.Host.Input;
using Lightward.Host.Simulation;
using Lightward.Optics;
using Lightward.Rendering;
using Lightward.Rendering.Instruments;

namespace Lightward.Cli.Tests;

public class FlyWindowTests
{
    [FlyWindowFact]
    public void Fly_opens_a_window_obeys_keys_and_screenshots_the_stars()
    {
        using var display = FlyDisplay.Start();
        string folder = Directory.CreateTempSubdirectory("lightward-fly-").FullName;
        var environment = new Dictionary<string, string> { ["DISPLAY"] = display.Name };
        Task<CliRunner.Result> flight = Task.Run(() => CliRunner.RunWith(folder, environment,
            "fly", "--seconds", "6", "--size", "640x360", "--state-out", "state.json", "--screenshot", "shot.png"));

        display.ParkPointerOn("Lightward", 100, 100);
        display.XDoTool("key", "z");                      // throttle-full
        display.XDoTool("key", "period", "period");       // time-faster twice: x100
        display.XDoTool("keydown", "d");                  // yaw-right
        Thread.Sleep(700);
        display.XDoTool("keyup", "d");

        CliRunner.Result result = flight.Result;
        Assert.True(result.ExitCode == 0, result.Stderr);
        Assert.Contains("(window)", result.Stdout);

        using JsonDocument state = JsonDocument.Parse(File.ReadAllText(Path.Combine(folder, "state.json")));
        JsonElement root = state.RootElement;
        Assert.True(root.GetProperty("windowed").GetBoolean());
        Assert.Equal(1, root.GetProperty("throttle").GetDouble());
        Assert.True(root.GetProperty("rapidity").GetDouble() > 0);
        // The demo starts with the nose on home +X and the right wing on home +Y: a yaw to the right swings the
        // nose toward +Y within the home X–Y plane, and the engine pushed the ship along where the nose pointed.
        // When the window saw the keys depends on how loaded the machine is, so the motion is not checked against a
        // fixed direction: at these speeds (β ~ 10⁻⁵) the velocity is the sum of thrusts along noses that swept from
        // +X to the final nose, so it lies in that plane and between the two (0.5° allowed for the nose settling
        // after the key went up: our own margin, no source).
        double[] forward = root.GetProperty("forward").EnumerateArray().Select(v => v.GetDouble()).ToArray();
        double[] motion = root.GetProperty("velocity_direction").EnumerateArray().Select(v => v.GetDouble()).ToArray();
        Assert.True(forward[1] > 0.01, $"nose did not swing right: {string.Join(", ", forward)}");
        double noseAngle = Math.Atan2(forward[1], forward[0]), motionAngle = Math.Atan2(motion[1], motion[0]), margin = 0.5 * Math.PI / 180;
        Assert.True(Math.Abs(motion[2]) < 1e-6 && motionAngle > -margin && motionAngle < noseAngle + margin,
            $"ship did not move along where its nose pointed: nose {string.Join(", ", forward)}, motion {string.Join(", ", motion)}");

        RgbaImage shot = PngWriter.Read(Path.Combine(folder, "shot.png"));
        Assert.Equal((640, 360), (shot.Width, shot.Height));
        Assert.True(CountStars(shot) > 50, "the screenshot shows no stars");
        Directory.Delete(folder, recursive: true);
    }

    [FlyWindowFact]
    public void A_monitor_the_display_does_not_have_is_a_user_error()
    {
        using var display = FlyDisplay.Start();
        var result = CliRunner.RunWith(Directory.GetCurrentDirectory(), new Dictionary<string, string> { ["DISPLAY"] = display.Name },
            "fly", "--monitor", "5", "--frames", "1");
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("lightward: error: --monitor: there is no monitor 5; this display has 1, numbered 0 to 0", result.Stderr);
    }

    [FlyWindowFact]
    public void The_window_shows_exactly_the_frame_the_headless_host_keeps()
    {
        using var display = FlyDisplay.Start();
        // GLFW reads the C library's environment, which Environment.SetEnvironmentVariable does not change on Linux.
        Assert.Equal(0, SetNativeEnvironment("DISPLAY", display.Name, 1));
        Environment.SetEnvironmentVariable("DISPLAY", display.Name);
        Assert.True(WindowHost.TryOpen(new WindowOptions(320, 180, "Lightward present check"), KeyFile.Defaults, out WindowHost? window, out string? problem), problem);
        using (window)
        {
            window!.CapturePresented = true;
            var session = new FlightSession(FlightSetup.Demo);
            var input = new PilotInput();
            input.AddPress(PilotAction.ThrottleFull);
            session.Update(input, 0.25);
            CockpitView view = session.View();

            using var overlay = new InstrumentOverlay();
            var renderer = new FrameComposer(new SkyRenderer(new Scene(StarCatalog.Procedural(5000, 3)), new FrameRenderer(), Math.PI / 2), overlay);
            var frame = new RgbaImage(320, 180);
            renderer.Render(view, frame);
            var again = new RgbaImage(320, 180);
            renderer.Render(view, again);
            Assert.Equal(frame.ReadOnlyPixels, again.ReadOnlyPixels);

            using var headless = new HeadlessHost(320, 180);
            headless.Present(frame.ReadOnlyPixels);
            window.Present(frame.ReadOnlyPixels);

            Assert.Equal((320, 180), (window.PresentedFrameWidth, window.PresentedFrameHeight));
            Assert.Equal(headless.LastFrame, window.PresentedFrame);
        }
    }

    [DllImport("libc", EntryPoint = "setenv")]
    private static extern int SetNativeEnvironment(string name, string value, int overwrite);

    /// <summary>Bright points outside the instrument panels (left column, lower-right diagram).</summary>
    private static int CountStars(RgbaImage image)
    {
        int stars = 0;
        for (int y = 0; y < image.Height; y++)
            for (int x = image.Width / 3; x < image.Width * 3 / 4; x++)
            {
                (byte r, byte g, byte b) = image[x, y];
                if (r + g + b > 240) stars++;
            }
        return stars;
    }
}
