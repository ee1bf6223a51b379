using Lightward.Cli;
using Lightward.Cli.Commands;
using Spectre.Console.Cli;

var app = new CommandApp();
app.Configure(config =>
{
    config.SetApplicationName("lightward");
    config.UseStrictParsing();
    config.SetExceptionHandler((exception, _) => ErrorReporting.Report(exception));
    config.AddCommand<VersionCommand>("version").WithDescription("Print the program version and data attributions.");
    config.AddCommand<RenderShowCommand>("render-show").WithDescription("Render a show script into a fulldome delivery folder: numbered PNG frames, soundtrack, extras and a cautions check.");
    config.AddCommand<ShowCommand>("show").WithDescription("Run a show live: dome output window, operator console in the terminal (go, hold, back, manual control).");
    config.AddCommand<CheckCommand>("check").WithDescription("Validate scenarios, burn plans and shows: every problem as file:line:column: key: what is wrong (what is allowed).");
    config.AddCommand<DrillCommand>("drill").WithDescription("Fly a scenario headless with a burn plan or the autopilot and score it, or score a folder of flight logs.");
    config.AddCommand<ReplayCommand>("replay").WithDescription("Re-fly a flight log bit-identically and compare its final state hash with the recorded one.");
    config.AddCommand<FlyCommand>("fly").WithDescription("Fly the ship in a window (keyboard, mouse, gamepad); headless PNG when there is no display.");
    config.AddCommand<ListenCommand>("listen").WithDescription("Hear beacons as a moving ship does (rate and pitch × Doppler factor), with engine and alerts; play live or write WAV.");
    config.AddCommand<RenderCommand>("render").WithDescription("Render one frame of the view from the ship to a PNG (perspective, dome master or equirectangular).");
    config.AddCommand<ObserveCommand>("observe").WithDescription("List what the ship sees of the brightest sources: apparent direction, Doppler factor, brightness, colour.");
    config.AddCommand<PlanCommand>("plan").WithDescription("Plan a straight trip under constant proper acceleration: times, speeds, propellant, light signals.");
});
return app.Run(args);
