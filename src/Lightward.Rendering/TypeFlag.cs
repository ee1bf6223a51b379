namespace Lightward.Rendering;

/// <summary>
/// A yes or no known when a hot loop is compiled, passed as a type argument: the JIT compiles one copy of the loop
/// per answer, so the copy for "no" carries no trace of the work it skips. Files name the answers for their own use
/// (<c>using WithOverlay = FlagSet;</c>).
/// </summary>
internal interface ITypeFlag
{
    static abstract bool IsSet { get; }
}

internal readonly struct FlagSet : ITypeFlag
{
    public static bool IsSet => true;
}

internal readonly struct FlagUnset : ITypeFlag
{
    public static bool IsSet => false;
}
