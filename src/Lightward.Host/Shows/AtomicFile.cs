using System.Diagnostics;

namespace Lightward.Host.Shows;

/// <summary>
/// Writes delivery files under a temporary name, then renames them into place, so a killed render never leaves a
/// half-written file under a final name. Unlike <see cref="Lightward.Scenarios.Files.UserFiles.WriteAtomically"/> the
/// temporary name carries the machine as well as the process, because shards on several cluster nodes share one
/// folder: a later run removes only the leftovers of its own machine's processes that are gone.
/// </summary>
public static class AtomicFile
{
    private const string Suffix = ".partial";
    private static readonly string Tag = $"{Environment.MachineName}-{Environment.ProcessId}";

    public static void Write(string path, Action<Stream> write)
    {
        string temporary = Temporary(path);
        try
        {
            using (FileStream stream = File.Create(temporary)) write(stream);
            File.Move(temporary, path, overwrite: true);
        }
        finally
        {
            if (File.Exists(temporary)) File.Delete(temporary);
        }
    }

    /// <summary>The temporary name for <paramref name="path"/>: hidden, in the same folder, ending in the original extension's neighbour <c>.partial</c>.</summary>
    public static string Temporary(string path) =>
        Path.Combine(Path.GetDirectoryName(path)!, $".{Path.GetFileName(path)}.{Tag}{Suffix}");

    /// <summary>Deletes leftovers of killed runs on this machine in <paramref name="folder"/> and its subfolders.</summary>
    public static void RemoveStale(string folder)
    {
        if (!Directory.Exists(folder)) return;
        string host = Environment.MachineName + "-";
        foreach (string file in Directory.EnumerateFiles(folder, "*" + Suffix, SearchOption.AllDirectories))
        {
            string name = Path.GetFileName(file);
            int tagStart = name.LastIndexOf("." + host, StringComparison.Ordinal);
            if (tagStart < 0) continue;
            string pidText = name[(tagStart + 1 + host.Length)..^Suffix.Length];
            if (int.TryParse(pidText, out int pid) && pid != Environment.ProcessId && !IsRunning(pid)) File.Delete(file);
        }
    }

    private static bool IsRunning(int pid)
    {
        try
        {
            using var process = Process.GetProcessById(pid);
            return !process.HasExited;
        }
        catch (ArgumentException)
        {
            return false;
        }
    }
}
