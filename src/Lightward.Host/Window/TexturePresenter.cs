using Silk.NET.OpenGL;

namespace Lightward.Host.Window;

/// <summary>
/// Shows a CPU-rendered RGBA frame: uploads it into one texture and draws it on a full-window triangle, letterboxed
/// to keep the frame's aspect. No GPU work beyond that copy; software GL (Mesa llvmpipe) is enough.
/// </summary>
internal sealed class TexturePresenter : IDisposable
{
    private const string VertexShader = """
        #version 330 core
        out vec2 frameCoordinate;
        void main()
        {
            // One triangle covering the viewport; frame row 0 is the top of the picture.
            vec2 corner = vec2(float((gl_VertexID << 1) & 2), float(gl_VertexID & 2));
            gl_Position = vec4(corner * 2.0 - 1.0, 0.0, 1.0);
            frameCoordinate = vec2(corner.x, 1.0 - corner.y);
        }
        """;

    private const string FragmentShader = """
        #version 330 core
        in vec2 frameCoordinate;
        uniform sampler2D frame;
        out vec4 colour;
        void main() { colour = texture(frame, frameCoordinate); }
        """;

    private readonly GL _gl;
    private readonly uint _program, _vertexArray, _texture;
    private readonly int _width, _height;

    public TexturePresenter(GL gl, int width, int height)
    {
        _gl = gl;
        _width = width;
        _height = height;
        _program = LinkProgram();
        _vertexArray = gl.GenVertexArray();
        _texture = gl.GenTexture();
        gl.BindTexture(TextureTarget.Texture2D, _texture);
        gl.TexParameter(TextureTarget.Texture2D, TextureParameterName.TextureWrapS, (int)GLEnum.ClampToEdge);
        gl.TexParameter(TextureTarget.Texture2D, TextureParameterName.TextureWrapT, (int)GLEnum.ClampToEdge);
        gl.TexImage2D<byte>(TextureTarget.Texture2D, 0, InternalFormat.Rgba8, (uint)width, (uint)height, 0, PixelFormat.Rgba, PixelType.UnsignedByte, ReadOnlySpan<byte>.Empty);
        gl.PixelStore(PixelStoreParameter.UnpackAlignment, 1);
        gl.PixelStore(PixelStoreParameter.PackAlignment, 1);
    }

    /// <summary>Draws <paramref name="rgba"/> into the current framebuffer of size <paramref name="targetWidth"/> × <paramref name="targetHeight"/>.</summary>
    public void Draw(ReadOnlySpan<byte> rgba, int targetWidth, int targetHeight)
    {
        GL gl = _gl;
        gl.BindTexture(TextureTarget.Texture2D, _texture);
        gl.TexSubImage2D(TextureTarget.Texture2D, 0, 0, 0, (uint)_width, (uint)_height, PixelFormat.Rgba, PixelType.UnsignedByte, rgba[..(_width * _height * 4)]);
        // Pixel for pixel when the window matches the frame; smooth scaling otherwise.
        bool exact = targetWidth == _width && targetHeight == _height;
        int filter = (int)(exact ? GLEnum.Nearest : GLEnum.Linear);
        gl.TexParameter(TextureTarget.Texture2D, TextureParameterName.TextureMinFilter, filter);
        gl.TexParameter(TextureTarget.Texture2D, TextureParameterName.TextureMagFilter, filter);

        double scale = Math.Min((double)targetWidth / _width, (double)targetHeight / _height);
        int viewWidth = exact ? _width : (int)Math.Round(_width * scale), viewHeight = exact ? _height : (int)Math.Round(_height * scale);
        gl.Viewport(0, 0, (uint)targetWidth, (uint)targetHeight);
        gl.ClearColor(0, 0, 0, 1);
        gl.Clear(ClearBufferMask.ColorBufferBit);
        gl.Viewport((targetWidth - viewWidth) / 2, (targetHeight - viewHeight) / 2, (uint)viewWidth, (uint)viewHeight);
        gl.UseProgram(_program);
        gl.BindVertexArray(_vertexArray);
        gl.DrawArrays(PrimitiveType.Triangles, 0, 3);
    }

    /// <summary>Reads the drawn picture back (before the buffer swap) as RGBA8, top row first.</summary>
    public void ReadBack(Span<byte> rgba, int targetWidth, int targetHeight)
    {
        int row = targetWidth * 4;
        var bottomUp = new byte[row * targetHeight];
        _gl.ReadPixels(0, 0, (uint)targetWidth, (uint)targetHeight, PixelFormat.Rgba, PixelType.UnsignedByte, bottomUp.AsSpan());
        for (int y = 0; y < targetHeight; y++) bottomUp.AsSpan((targetHeight - 1 - y) * row, row).CopyTo(rgba.Slice(y * row, row));
    }

    private uint LinkProgram()
    {
        uint vertex = Compile(ShaderType.VertexShader, VertexShader), fragment = Compile(ShaderType.FragmentShader, FragmentShader);
        uint program = _gl.CreateProgram();
        _gl.AttachShader(program, vertex);
        _gl.AttachShader(program, fragment);
        _gl.LinkProgram(program);
        _gl.GetProgram(program, ProgramPropertyARB.LinkStatus, out int linked);
        if (linked == 0) throw new InvalidOperationException("OpenGL could not link the frame shader: " + _gl.GetProgramInfoLog(program));
        _gl.DeleteShader(vertex);
        _gl.DeleteShader(fragment);
        return program;
    }

    private uint Compile(ShaderType type, string source)
    {
        uint shader = _gl.CreateShader(type);
        _gl.ShaderSource(shader, source);
        _gl.CompileShader(shader);
        _gl.GetShader(shader, ShaderParameterName.CompileStatus, out int compiled);
        if (compiled == 0) throw new InvalidOperationException($"OpenGL could not compile the {type}: " + _gl.GetShaderInfoLog(shader));
        return shader;
    }

    public void Dispose()
    {
        _gl.DeleteTexture(_texture);
        _gl.DeleteVertexArray(_vertexArray);
        _gl.DeleteProgram(_program);
    }
}
