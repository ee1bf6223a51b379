using System.Runtime.InteropServices;
using System.Text;

namespace Lightward.Host.Window;

/// <summary>
/// The few GLFW 3.3 entry points the window host needs, bound at run time from the system's libglfw.so.3 so that a
/// machine without it gets a clear message instead of a crash.
/// </summary>
internal static unsafe class Glfw
{
    public const string LibraryName = "libglfw.so.3";
    public const int True = 1;
    public const int Press = 1, Release = 0;
    public const int ContextVersionMajor = 0x00022002, ContextVersionMinor = 0x00022003, OpenGlProfile = 0x00022008, OpenGlCoreProfile = 0x00032001;
    public const int Resizable = 0x00020003, Visible = 0x00020004;
    public const int MouseButtonLeft = 0, MouseButtonRight = 1, MouseButtonMiddle = 2;
    public const int JoystickLast = 15;

    [StructLayout(LayoutKind.Sequential)]
    public struct VideoMode { public int Width, Height, RedBits, GreenBits, BlueBits, RefreshRate; }

    [StructLayout(LayoutKind.Sequential)]
    public struct GamepadState
    {
        public fixed byte Buttons[15];
        public fixed float Axes[6];
    }

    private static nint _library;

    public static delegate* unmanaged<int> Init;
    public static delegate* unmanaged<void> Terminate;
    public static delegate* unmanaged<byte**, int> GetError;
    public static delegate* unmanaged<int, int, void> WindowHint;
    public static delegate* unmanaged<int, int, byte*, nint, nint, nint> CreateWindow;
    public static delegate* unmanaged<nint, void> DestroyWindow;
    public static delegate* unmanaged<nint, void> MakeContextCurrent;
    public static delegate* unmanaged<int, void> SwapInterval;
    public static delegate* unmanaged<nint, void> SwapBuffers;
    public static delegate* unmanaged<void> PollEvents;
    public static delegate* unmanaged<nint, int> WindowShouldClose;
    public static delegate* unmanaged<byte*, nint> GetProcAddress;
    public static delegate* unmanaged<nint, int*, int*, void> GetFramebufferSize;
    public static delegate* unmanaged<double> GetTime;
    public static delegate* unmanaged<int*, nint*> GetMonitors;
    public static delegate* unmanaged<nint, VideoMode*> GetVideoMode;
    public static delegate* unmanaged<nint, int, int> GetMouseButton;
    public static delegate* unmanaged<nint, double*, double*, void> GetCursorPos;
    public static delegate* unmanaged<nint, nint, nint> SetKeyCallback;
    public static delegate* unmanaged<nint, nint, nint> SetMouseButtonCallback;
    public static delegate* unmanaged<int, int> JoystickIsGamepad;
    public static delegate* unmanaged<int, GamepadState*, int> GetGamepadState;

    /// <summary>Loads libglfw.so.3; false (with the reason) when it is not installed.</summary>
    public static bool TryLoad(out string? problem)
    {
        problem = null;
        if (_library != 0) return true;
        if (!NativeLibrary.TryLoad(LibraryName, out nint library))
        {
            problem = $"{LibraryName} is not installed";
            return false;
        }
        try
        {
            Init = (delegate* unmanaged<int>)NativeLibrary.GetExport(library, "glfwInit");
            Terminate = (delegate* unmanaged<void>)NativeLibrary.GetExport(library, "glfwTerminate");
            GetError = (delegate* unmanaged<byte**, int>)NativeLibrary.GetExport(library, "glfwGetError");
            WindowHint = (delegate* unmanaged<int, int, void>)NativeLibrary.GetExport(library, "glfwWindowHint");
            CreateWindow = (delegate* unmanaged<int, int, byte*, nint, nint, nint>)NativeLibrary.GetExport(library, "glfwCreateWindow");
            DestroyWindow = (delegate* unmanaged<nint, void>)NativeLibrary.GetExport(library, "glfwDestroyWindow");
            MakeContextCurrent = (delegate* unmanaged<nint, void>)NativeLibrary.GetExport(library, "glfwMakeContextCurrent");
            SwapInterval = (delegate* unmanaged<int, void>)NativeLibrary.GetExport(library, "glfwSwapInterval");
            SwapBuffers = (delegate* unmanaged<nint, void>)NativeLibrary.GetExport(library, "glfwSwapBuffers");
            PollEvents = (delegate* unmanaged<void>)NativeLibrary.GetExport(library, "glfwPollEvents");
            WindowShouldClose = (delegate* unmanaged<nint, int>)NativeLibrary.GetExport(library, "glfwWindowShouldClose");
            GetProcAddress = (delegate* unmanaged<byte*, nint>)NativeLibrary.GetExport(library, "glfwGetProcAddress");
            GetFramebufferSize = (delegate* unmanaged<nint, int*, int*, void>)NativeLibrary.GetExport(library, "glfwGetFramebufferSize");
            GetTime = (delegate* unmanaged<double>)NativeLibrary.GetExport(library, "glfwGetTime");
            GetMonitors = (delegate* unmanaged<int*, nint*>)NativeLibrary.GetExport(library, "glfwGetMonitors");
            GetVideoMode = (delegate* unmanaged<nint, VideoMode*>)NativeLibrary.GetExport(library, "glfwGetVideoMode");
            GetMouseButton = (delegate* unmanaged<nint, int, int>)NativeLibrary.GetExport(library, "glfwGetMouseButton");
            GetCursorPos = (delegate* unmanaged<nint, double*, double*, void>)NativeLibrary.GetExport(library, "glfwGetCursorPos");
            SetKeyCallback = (delegate* unmanaged<nint, nint, nint>)NativeLibrary.GetExport(library, "glfwSetKeyCallback");
            SetMouseButtonCallback = (delegate* unmanaged<nint, nint, nint>)NativeLibrary.GetExport(library, "glfwSetMouseButtonCallback");
            JoystickIsGamepad = (delegate* unmanaged<int, int>)NativeLibrary.GetExport(library, "glfwJoystickIsGamepad");
            GetGamepadState = (delegate* unmanaged<int, GamepadState*, int>)NativeLibrary.GetExport(library, "glfwGetGamepadState");
        }
        catch (EntryPointNotFoundException missing)
        {
            NativeLibrary.Free(library);
            problem = $"{LibraryName} is too old (GLFW 3.3 or later is needed): {missing.Message}";
            return false;
        }
        _library = library;
        return true;
    }

    /// <summary>GLFW's description of its last error, or a fallback.</summary>
    public static string LastError(string fallback)
    {
        byte* description = null;
        int code = GetError(&description);
        return code == 0 || description == null ? fallback : Marshal.PtrToStringUTF8((nint)description) ?? fallback;
    }

    public static nint ProcAddress(string name)
    {
        byte[] utf8 = Encoding.UTF8.GetBytes(name + "\0");
        fixed (byte* pointer = utf8) return GetProcAddress(pointer);
    }
}
