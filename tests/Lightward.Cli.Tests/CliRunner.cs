using System.Runtime.CompilerServices;
using System.Diagnostics;

namespace Lightward.Cli.Tests;

/// <summary>Runs the built `lightward` command in a child process, as a user would, and captures what it prints.</summary>
public static class CliRunner
{
    public sealed record Result(int ExitCode, string Stdout, string Stderr);

    public static Result Run(params string[] arguments) => RunIn(Directory.GetCurrentDirectory(), arguments);

    public static Result RunIn(string workingDirectory, params string[] arguments) => RunWith(workingDirectory, new Dictionary<string, string>(), arguments);

    /// <summary>Runs with extra environment variables (e.g. DISPLAY for the window tests).</summary>
    public static Result RunWith(string workingDirectory, IReadOnlyDictionary<string, string> environment, params string[] arguments)
    {
        string dll = Path.Combine(AppContext.BaseDirectory, "lightward.dll");
        var start = new ProcessStartInfo("dotnet") { WorkingDirectory = workingDirectory, RedirectStandardOutput = true, RedirectStandardError = true };
        start.ArgumentList.Add(dll);
        foreach (string argument in arguments) start.ArgumentList.Add(argument);
        start.Environment["NO_COLOR"] = "1";
        start.Environment.Remove("DISPLAY");
        foreach ((string name, string value) in environment) start.Environment[name] = value;
        using var process = Process.Start(start)!;
        Task<string> stdout = process.StandardOutput.ReadToEndAsync();
        Task<string> stderr = process.StandardError.ReadToEndAsync();
        if (!process.WaitForExit(TimeSpan.FromMinutes(3)))
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException($"lightward {string.Join(' ', arguments)} did not finish in 3 minutes");
        }
        return new Result(process.ExitCode, stdout.Result, stderr.Result);
    }

    /// <summary>
    /// The repository root (holds Lightward.sln), for tests that read shipped scenarios and assets; found from this
    /// source file, so builds to any artifacts path work.
    /// </summary>
    public static string RepositoryRoot { get; } = Path.GetFullPath(Path.Combine(Path.GetDirectoryName(ThisFile())!, "..", ".."));

    private static string ThisFile([CallerFilePath] string path = "") => path;
}
