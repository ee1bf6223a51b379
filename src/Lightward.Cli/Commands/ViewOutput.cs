using Lightward.Spacetime;

namespace Lightward.Cli.Commands;

/// <summary>Checks an output path before any work is done, so a bad path fails fast and names its flag.</summary>
public static class ViewOutput
{
    /// <summary>The full path of <paramref name="path"/> after checking its folder exists and accepts a new file.</summary>
    public static string CheckWritable(string path, string flag)
    {
        string fullPath;
        try { fullPath = Path.GetFullPath(path); }
        catch (Exception e) when (e is ArgumentException or NotSupportedException or PathTooLongException)
        {
            throw new UserInputException($"{flag}: '{path}' is not a valid file path ({e.Message})");
        }
        if (Directory.Exists(fullPath)) throw new UserInputException($"{flag}: '{path}' is a folder; give a file name such as frame.png");
        string folder = Path.GetDirectoryName(fullPath)!;
        if (!Directory.Exists(folder)) throw new UserInputException($"{flag}: folder '{folder}' does not exist");
        string probe = Path.Combine(folder, $".{Path.GetFileName(fullPath)}.{Environment.ProcessId}.probe");
        try
        {
            using (File.Create(probe)) { }
            File.Delete(probe);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new UserInputException($"{flag}: cannot write in folder '{folder}' ({e.Message})");
        }
        return fullPath;
    }
}
