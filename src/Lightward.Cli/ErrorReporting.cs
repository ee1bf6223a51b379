using Lightward.Spacetime;
using Spectre.Console;
using Spectre.Console.Cli;

namespace Lightward.Cli;

/// <summary>Turns exceptions into one clear line and an exit code: 2 for anything the user can fix, 1 for our bugs.</summary>
public static class ErrorReporting
{
    public const int Success = 0;
    public const int InternalError = 1;
    public const int UserError = 2;

    public static int Report(Exception exception)
    {
        switch (exception)
        {
            case UserInputException or CommandParseException or CommandRuntimeException:
                Console.Error.WriteLine($"lightward: error: {exception.Message}");
                return UserError;
            default:
                Console.Error.WriteLine($"lightward: internal error (please report): {exception.GetType().Name}: {exception.Message}");
                Console.Error.WriteLine(exception.StackTrace);
                return InternalError;
        }
    }
}
