using System.Diagnostics;

namespace Lightward.Host.Shows;

/// <summary>
/// Writes delivery files under a temporary name tagged with this machine and process, then renames them into place,
/// like <see cref="Lightward.Scenarios.Files.UserFiles.WriteAtomically"/> but with the machine in the name, because shards on
/// several cluster nodes share one folder and must tell their own leftovers from a live neighbour's;
/// so a killed render never leaves a half-written file under a final name. A later run removes the leftovers of
/// processes that are gone; runs on other machines sharing the folder keep theirs.
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
