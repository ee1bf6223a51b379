using System.Runtime.CompilerServices;

namespace Lightward.Scenarios.Tests;

/// <summary>Paths inside the repository, found from this source file so builds with any artifacts path work.</summary>
public static class Repository
{
    public static string Root { get; } = Path.GetFullPath(Path.Combine(Path.GetDirectoryName(ThisFile())!, "..", ".."));

    public static string Scenarios => Path.Combine(Root, "scenarios");

    private static string ThisFile([CallerFilePath] string path = "") => path;
}
