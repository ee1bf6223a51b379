using Lightward.Rendering;

namespace Lightward.Cli.Tests;

public class RenderCommandTests
{
    private static string TempFolder()
    {
        string folder = Path.Combine(Path.GetTempPath(), "lightward-render-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(folder);
        return folder;
    }

    [Theory]
    [InlineData("perspective", "320x180", 320, 180)]
    [InlineData("dome", "256x256", 256, 256)]
    [InlineData("equirect", "256x128", 256, 128)]
    public void Renders_a_png_of_the_requested_projection_and_size(string projection, string size, int width, int height)
    {
        string folder = TempFolder();
        string output = Path.Combine(folder, "frame.png");
        var result = CliRunner.Run("render", "--projection", projection, "--size", size, "--heading", "Vega", "--beta", "0.5", "--out", output);
        Assert.True(result.ExitCode == 0, result.Stderr);
        Assert.Contains("wrote", result.Stdout);
        RgbaImage image = PngWriter.Read(output);
        Assert.Equal((width, height), (image.Width, image.Height));
        Assert.Contains(image.ReadOnlyPixels.ToArray(), b => b > 100);
        Assert.Equal(["frame.png"], Directory.GetFiles(folder).Select(Path.GetFileName));
    }

    [Fact]
    public void Same_flags_give_the_same_image_bytes_on_one_or_two_threads()
    {
        string folder = TempFolder();
        string[] flags = ["render", "--sky", "procedural", "--stars", "20000", "--seed", "3", "--rapidity", "2", "--look", "30,10", "--size", "200x120"];
        Assert.Equal(0, CliRunner.Run([.. flags, "--threads", "1", "--out", Path.Combine(folder, "one.png")]).ExitCode);
        Assert.Equal(0, CliRunner.Run([.. flags, "--threads", "2", "--out", Path.Combine(folder, "two.png")]).ExitCode);
        Assert.Equal(PngWriter.Read(Path.Combine(folder, "one.png")).Pixels, PngWriter.Read(Path.Combine(folder, "two.png")).Pixels);
    }

    [Theory]
    [InlineData("--beta", "1", "--beta")]
    [InlineData("--beta", "-1.5", "--beta")]
    [InlineData("--beta", "NaN", "--beta")]
    [InlineData("--rapidity", "Infinity", "--rapidity")]
    [InlineData("--size", "0x100", "--size")]
    [InlineData("--size", "16385x100", "--size")]
    [InlineData("--size", "12 by 8", "--size")]
    [InlineData("--heading", "Nowhere Star", "--heading")]
    [InlineData("--exposure", "bright", "--exposure")]
    [InlineData("--fov", "180", "--fov")]
    public void Bad_input_is_one_line_naming_the_flag_with_exit_code_2_and_no_file(string flag, string value, string named)
    {
        string folder = TempFolder();
        var result = CliRunner.Run("render", flag, value, "--size", flag == "--size" ? value : "64x36", "--out", Path.Combine(folder, "frame.png"));
        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("lightward: error: ", result.Stderr);
        Assert.Contains(named, result.Stderr);
        Assert.Single(result.Stderr.Trim().Split('\n'));
        Assert.Empty(Directory.GetFiles(folder));
    }

    [Fact]
    public void Beta_and_rapidity_together_are_refused()
    {
        var result = CliRunner.Run("render", "--beta", "0.5", "--rapidity", "1", "--out", Path.Combine(TempFolder(), "x.png"));
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("--rapidity", result.Stderr);
    }

    [Fact]
    public void An_unwritable_output_folder_is_named()
    {
        var result = CliRunner.Run("render", "--size", "64x36", "--out", "/no/such/folder/frame.png");
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("--out", result.Stderr);
        Assert.DoesNotContain("   at ", result.Stderr);
    }

    [Fact]
    public void Renders_the_view_from_a_scenarios_ship_and_refuses_flags_that_would_replace_it()
    {
        string scenario = ShippedScenarios.File("free-flight.toml");
        string output = Path.Combine(TempFolder(), "scenario.png");
        var result = CliRunner.Run("render", scenario, "--at", "10 min", "--size", "160x90", "--out", output);
        Assert.True(result.ExitCode == 0, result.Stderr);
        Assert.True(File.Exists(output));

        var conflict = CliRunner.Run("render", scenario, "--heading", "Vega", "--out", output);
        Assert.Equal(2, conflict.ExitCode);
        Assert.Contains("--heading", conflict.Stderr);
    }
}
