using System.Diagnostics;
using System.Globalization;

namespace Lightward.Cli.Tests;

/// <summary>A private X server (Xvfb) on a free display number for the window tests, stopped on dispose.</summary>
public sealed class FlyDisplay : IDisposable
{
    private readonly Process _server;

    private FlyDisplay(Process server, string name)
    {
        _server = server;
        Name = name;
    }

    /// <summary>The DISPLAY value, e.g. ":97".</summary>
    public string Name { get; }

    public static bool ToolsInstalled => OnPath("Xvfb") && OnPath("xdotool");

    public const string MissingToolsReason = "Xvfb or xdotool is not installed (apt-get install xvfb xauth xdotool); the window tests need them";

    /// <summary>
    /// Starts Xvfb on a display number it picks itself (-displayfd: it skips numbers in use and clears locks left by
    /// servers that died) and waits for it to print that number.
    /// </summary>
    public static FlyDisplay Start()
    {
        var start = new ProcessStartInfo("Xvfb") { RedirectStandardError = true, RedirectStandardOutput = true };
        foreach (string argument in new[] { "-displayfd", "1", "-screen", "0", "1280x720x24", "-nolisten", "tcp" }) start.ArgumentList.Add(argument);
        var server = Process.Start(start)!;
        _ = server.StandardError.ReadToEndAsync();
        Task<string?> number = server.StandardOutput.ReadLineAsync();
        if (number.Wait(TimeSpan.FromSeconds(15)) && int.TryParse(number.Result, out int display))
            return new FlyDisplay(server, $":{display}");
        if (!server.HasExited) server.Kill();
        server.Dispose();
        throw new InvalidOperationException("Xvfb did not start");
    }

    /// <summary>
    /// Waits until a window named <paramref name="name"/> is mapped, then parks the pointer at (<paramref name="x"/>,
    /// <paramref name="y"/>) inside it. With no window manager, keyboard focus follows the pointer:
    /// keys sent while the pointer is over a window that exists but is not yet mapped reach no window at all, which
    /// made a window test fail once on a loaded machine.
    /// </summary>
    public void ParkPointerOn(string name, int x, int y)
    {
        string window = XDoTool("search", "--sync", "--onlyvisible", "--name", name).Split('\n')[0].Trim();
        XDoTool("mousemove", "--window", window, x.ToString(CultureInfo.InvariantCulture), y.ToString(CultureInfo.InvariantCulture));
    }

    /// <summary>Runs xdotool against this display and returns what it printed.</summary>
    public string XDoTool(params string[] arguments)
    {
        var start = new ProcessStartInfo("xdotool") { RedirectStandardOutput = true, RedirectStandardError = true };
        foreach (string argument in arguments) start.ArgumentList.Add(argument);
        start.Environment["DISPLAY"] = Name;
        using var process = Process.Start(start)!;
        Task<string> output = process.StandardOutput.ReadToEndAsync();
        Task<string> error = process.StandardError.ReadToEndAsync();
        if (!process.WaitForExit(TimeSpan.FromSeconds(90))) { process.Kill(); throw new TimeoutException($"xdotool {string.Join(' ', arguments)} hung"); }
        if (process.ExitCode != 0) throw new InvalidOperationException($"xdotool {string.Join(' ', arguments)} failed: {error.Result}");
        return output.Result;
    }

    /// <summary>Stops the server with SIGTERM, so that it removes its lock file and socket, and kills it if it lingers.</summary>
    public void Dispose()
    {
        if (!_server.HasExited)
        {
            _ = Kill(_server.Id, Terminate);
            if (!_server.WaitForExit(5000))
            {
                _server.Kill();
                _server.WaitForExit(5000);
            }
        }
        _server.Dispose();
    }

    private const int Terminate = 15; // SIGTERM

    [System.Runtime.InteropServices.DllImport("libc", EntryPoint = "kill")]
    private static extern int Kill(int processId, int signal);

    private static bool OnPath(string program) =>
        (Environment.GetEnvironmentVariable("PATH") ?? "").Split(':', StringSplitOptions.RemoveEmptyEntries).Any(folder => File.Exists(Path.Combine(folder, program)));
}

/// <summary>A test that needs an X server; skipped, with the reason, only where Xvfb or xdotool is not installed.</summary>
public sealed class FlyWindowFactAttribute : FactAttribute
{
    public FlyWindowFactAttribute()
    {
        if (!FlyDisplay.ToolsInstalled) Skip = FlyDisplay.MissingToolsReason;
    }
}
