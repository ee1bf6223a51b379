namespace Lightward.Spacetime;

/// <summary>
/// A problem with something the user gave (a flag, a file, a value). The command line prints only its message
/// and exits with code 2; it never shows a stack trace for these.
/// </summary>
public class UserInputException(string message) : Exception(message);
