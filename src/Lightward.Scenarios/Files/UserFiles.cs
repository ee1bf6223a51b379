using System.Text;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Files;

/// <summary>Reading and writing the user's files with clear errors, and writing outputs atomically.</summary>
public static class UserFiles
{
    /// <summary>Largest input file we read; anything bigger is surely not a scenario, plan or log.</summary>
    public const long MaxInputBytes = 64L << 20;

    public static byte[] ReadBytes(string path, string what)
    {
        try
        {
            var info = new FileInfo(path);
            if (!info.Exists) throw new UserInputException($"{path}: {what} file not found");
            if (info.Length > MaxInputBytes) throw new UserInputException($"{path}: {what} file is {info.Length} bytes (at most {MaxInputBytes} allowed)");
            return File.ReadAllBytes(path);
        }
        catch (Exception exception) when (exception is IOException or UnauthorizedAccessException)
        {
            throw new UserInputException($"{path}: cannot read {what} file: {exception.Message}");
        }
    }

    /// <summary>UTF-8 text (a byte-order mark is skipped); invalid bytes are a located problem.</summary>
    public static string DecodeUtf8(byte[] content, string path, List<FileProblem> problems)
    {
        try
        {
            return new UTF8Encoding(false, throwOnInvalidBytes: true).GetString(content).TrimStart('\uFEFF');
        }
        catch (DecoderFallbackException)
        {
            problems.Add(new FileProblem(new SourceLocation(path, 1, 1), "", "the file is not valid UTF-8 text", "a UTF-8 TOML file"));
            return "";
        }
    }

    /// <summary>Writes through a temporary file in the same folder, then renames it into place.</summary>
    public static void WriteAtomically(string path, Action<Stream> write)
    {
        string full = Path.GetFullPath(path);
        string directory = Path.GetDirectoryName(full)!;
        if (!Directory.Exists(directory)) throw new UserInputException($"{path}: folder {directory} does not exist");
        string temporary = Path.Combine(directory, $".{Path.GetFileName(full)}.{Environment.ProcessId}.tmp");
        try
        {
            using (var stream = new FileStream(temporary, FileMode.Create, FileAccess.Write, FileShare.None))
                write(stream);
            File.Move(temporary, full, overwrite: true);
        }
        catch (Exception exception) when (exception is IOException or UnauthorizedAccessException)
        {
            File.Delete(temporary);
            throw new UserInputException($"{path}: cannot write: {exception.Message}");
        }
    }

    public static void WriteTextAtomically(string path, string text) =>
        WriteAtomically(path, stream => stream.Write(new UTF8Encoding(false).GetBytes(text)));
}
